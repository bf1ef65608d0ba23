import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { ownErrorMeta } from "@/lib/query-client";

/** Accepts the only annotator's submitted work on a document: it becomes the gold. */
export const acceptAssignment = (orgId: string, corpusId: string, assignmentId: string) =>
  api.post<void>(`/orgs/${orgId}/corpora/${corpusId}/assignments/${assignmentId}/accept`);

export function useAcceptAssignment(orgId: string, corpusId: string) {
  const qc = useQueryClient();
  return useMutation({
    meta: ownErrorMeta,
    mutationFn: (assignmentId: string) => acceptAssignment(orgId, corpusId, assignmentId),
    onSettled: () => {
      void qc.invalidateQueries({ queryKey: ["orgs", orgId, "review"] });
      void qc.invalidateQueries({ queryKey: ["orgs", orgId, "batches"] });
    },
  });
}
