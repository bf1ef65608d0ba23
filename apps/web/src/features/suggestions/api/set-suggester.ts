import type { SetSuggesterInput, SuggesterStatus } from "@tagloom/contracts";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { corpusKey } from "@/features/corpora/api/keys";
import { api } from "@/lib/api-client";
import { suggesterQueryKey } from "./get-suggester";
import { ownErrorMeta } from "@/lib/query-client";

export function useSetSuggester(orgId: string, corpusId: string) {
  const qc = useQueryClient();
  return useMutation({
    meta: ownErrorMeta,
    mutationFn: (input: SetSuggesterInput) => api.put<SuggesterStatus>(`/orgs/${orgId}/corpora/${corpusId}/suggester`, input),
    onSuccess: (status) => qc.setQueryData(suggesterQueryKey(orgId, corpusId), status),
    onSettled: () => qc.invalidateQueries({ queryKey: corpusKey(orgId, corpusId) }),
  });
}
