import type { Corpus, CreateCorpusInput } from "@tagloom/contracts";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { corporaKey } from "./keys";
import { ownErrorMeta } from "@/lib/query-client";

export const createCorpus = (orgId: string, input: CreateCorpusInput) => api.post<Corpus>(`/orgs/${orgId}/corpora`, input);

export function useCreateCorpus(orgId: string) {
  const qc = useQueryClient();
  return useMutation({
    meta: ownErrorMeta,
    mutationFn: (input: CreateCorpusInput) => createCorpus(orgId, input),
    onSettled: () => qc.invalidateQueries({ queryKey: corporaKey(orgId) }),
  });
}
