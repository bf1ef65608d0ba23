import type { Corpus, UpdateCorpusInput } from "@tagloom/contracts";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { corporaKey } from "./keys";
import { ownErrorMeta } from "@/lib/query-client";

export const updateCorpus = (orgId: string, corpusId: string, input: UpdateCorpusInput) => api.patch<Corpus>(`/orgs/${orgId}/corpora/${corpusId}`, input);

/** Renames, describes, archives or unarchives a corpus. */
export function useUpdateCorpus(orgId: string, corpusId: string) {
  const qc = useQueryClient();
  return useMutation({
    meta: ownErrorMeta,
    mutationFn: (input: UpdateCorpusInput) => updateCorpus(orgId, corpusId, input),
    onSettled: () => qc.invalidateQueries({ queryKey: corporaKey(orgId) }),
  });
}
