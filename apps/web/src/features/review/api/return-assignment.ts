import type { ReturnAssignmentInput } from "@tagloom/contracts";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { ownErrorMeta } from "@/lib/query-client";

/** Sends submitted work back to its annotator with a comment (they get an e-mail). */
export const returnAssignment = (orgId: string, corpusId: string, assignmentId: string, input: ReturnAssignmentInput) =>
  api.post<void>(`/orgs/${orgId}/corpora/${corpusId}/assignments/${assignmentId}/return`, input);

export function useReturnAssignment(orgId: string, corpusId: string) {
  const qc = useQueryClient();
  return useMutation({
    meta: ownErrorMeta,
    mutationFn: ({ assignmentId, comment }: { assignmentId: string; comment: string }) => returnAssignment(orgId, corpusId, assignmentId, { comment }),
    onSettled: () => {
      void qc.invalidateQueries({ queryKey: ["orgs", orgId, "review"] });
      void qc.invalidateQueries({ queryKey: ["orgs", orgId, "batches"] });
    },
  });
}
