import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { corporaKey, corpusKey } from "./keys";
import { ownErrorMeta } from "@/lib/query-client";

export const deleteCorpus = (orgId: string, corpusId: string, confirmName: string) =>
  api.delete<void>(`/orgs/${orgId}/corpora/${corpusId}`, { body: { confirmName } });

/** Deletes a corpus for good; the caller types its name to confirm. */
export function useDeleteCorpus(orgId: string, corpusId: string) {
  const qc = useQueryClient();
  return useMutation({
    meta: ownErrorMeta,
    mutationFn: (confirmName: string) => deleteCorpus(orgId, corpusId, confirmName),
    onSuccess: () => {
      qc.removeQueries({ queryKey: corpusKey(orgId, corpusId) });
      return qc.invalidateQueries({ queryKey: [...corporaKey(orgId), "list"] });
    },
  });
}
