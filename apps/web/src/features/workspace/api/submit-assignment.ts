import type { SaveAssignmentResult } from "@tagloom/contracts";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { ownErrorMeta } from "@/lib/query-client";

export const submitAssignment = (orgId: string, corpusId: string, assignmentId: string, version: number) =>
  api.post<SaveAssignmentResult>(`/orgs/${orgId}/corpora/${corpusId}/assignments/${assignmentId}/submit`, { version });

export function useSubmitAssignment(orgId: string, corpusId: string, assignmentId: string) {
  const qc = useQueryClient();
  return useMutation({
    meta: ownErrorMeta,
    mutationFn: (version: number) => submitAssignment(orgId, corpusId, assignmentId, version),
    onSettled: () => qc.invalidateQueries({ queryKey: ["orgs", orgId, "queue"] }),
  });
}
