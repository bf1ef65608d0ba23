import type { CreateApiTokenInput, CreatedApiToken } from "@tagloom/contracts";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { apiTokensQueryKey } from "./get-api-tokens";
import { ownErrorMeta } from "@/lib/query-client";

export function useCreateApiToken(orgId: string) {
  const qc = useQueryClient();
  return useMutation({
    meta: ownErrorMeta,
    mutationFn: (input: CreateApiTokenInput) => api.post<CreatedApiToken>(`/orgs/${orgId}/tokens`, input),
    onSettled: () => qc.invalidateQueries({ queryKey: apiTokensQueryKey(orgId) }),
  });
}
