import type { Corpus, CreateCorpusInput } from "@tagloom/contracts";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { corporaKey } from "./keys";

export const createCorpus = (orgId: string, input: CreateCorpusInput) => api.post<Corpus>(`/orgs/${orgId}/corpora`, input);

export function useCreateCorpus(orgId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateCorpusInput) => createCorpus(orgId, input),
    onSettled: () => qc.invalidateQueries({ queryKey: corporaKey(orgId) }),
  });
}
