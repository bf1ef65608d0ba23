import type { UncertainRanking } from "@tagloom/contracts";
import { queryOptions, useQuery } from "@tanstack/react-query";
import { corpusKey } from "@/features/corpora/api/keys";
import { api } from "@/lib/api-client";

export const uncertainQueryOptions = (orgId: string, corpusId: string, limit: number) =>
  queryOptions({
    queryKey: [...corpusKey(orgId, corpusId), "uncertain", limit],
    queryFn: () => api.get<UncertainRanking>(`/orgs/${orgId}/corpora/${corpusId}/uncertain?limit=${limit}`),
  });

export function useUncertainDocuments(orgId: string, corpusId: string, limit: number) {
  return useQuery(uncertainQueryOptions(orgId, corpusId, limit));
}
