import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { apiTokensQueryKey } from "./get-api-tokens";
import { ownErrorMeta } from "@/lib/query-client";

export function useRevokeApiToken(orgId: string) {
  const qc = useQueryClient();
  return useMutation({
    meta: ownErrorMeta,
    mutationFn: (tokenId: string) => api.delete<void>(`/orgs/${orgId}/tokens/${tokenId}`),
    onSettled: () => qc.invalidateQueries({ queryKey: apiTokensQueryKey(orgId) }),
  });
}
