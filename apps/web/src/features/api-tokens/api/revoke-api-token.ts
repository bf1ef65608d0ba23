import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { apiTokensQueryKey } from "./get-api-tokens";

export function useRevokeApiToken(orgId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (tokenId: string) => api.delete<void>(`/orgs/${orgId}/tokens/${tokenId}`),
    onSettled: () => qc.invalidateQueries({ queryKey: apiTokensQueryKey(orgId) }),
  });
}
