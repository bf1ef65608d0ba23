import type { ApiToken, Page } from "@tagloom/contracts";
import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";

export const apiTokensQueryKey = (orgId: string) => ["orgs", orgId, "tokens"] as const;

export const apiTokensQueryOptions = (orgId: string) =>
  queryOptions({ queryKey: apiTokensQueryKey(orgId), queryFn: () => api.get<Page<ApiToken>>(`/orgs/${orgId}/tokens`) });

export function useApiTokens(orgId: string) {
  return useQuery(apiTokensQueryOptions(orgId));
}
