import type { SetSplitInput, SetSplitResult } from "@tagloom/contracts";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { corpusKey } from "./keys";
import { ownErrorMeta } from "@/lib/query-client";

export const setSplit = (orgId: string, corpusId: string, input: SetSplitInput) =>
  api.post<SetSplitResult>(`/orgs/${orgId}/corpora/${corpusId}/documents/split`, input);

/** Sets train/test on chosen documents, or splits the corpus by a seeded random percentage. */
export function useSetSplit(orgId: string, corpusId: string) {
  const qc = useQueryClient();
  return useMutation({
    meta: ownErrorMeta,
    mutationFn: (input: SetSplitInput) => setSplit(orgId, corpusId, input),
    onSettled: () => qc.invalidateQueries({ queryKey: corpusKey(orgId, corpusId) }),
  });
}
