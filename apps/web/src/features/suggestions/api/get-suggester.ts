import type { SuggesterStatus } from "@tagloom/contracts";
import { queryOptions, useQuery } from "@tanstack/react-query";
import { corpusKey } from "@/features/corpora/api/keys";
import { api } from "@/lib/api-client";

export const suggesterQueryKey = (orgId: string, corpusId: string) => [...corpusKey(orgId, corpusId), "suggester"] as const;

export const suggesterQueryOptions = (orgId: string, corpusId: string) =>
  queryOptions({
    queryKey: suggesterQueryKey(orgId, corpusId),
    queryFn: () => api.get<SuggesterStatus>(`/orgs/${orgId}/corpora/${corpusId}/suggester`),
    // Its candidates change whenever a training run finishes in the worker, which no mutation of
    // this page knows about: read it afresh on every visit instead of trusting a cached copy.
    staleTime: 0,
    // While a suggestion run is going, its progress changes by itself.
    refetchInterval: (q) => (q.state.data?.runs.some((r) => r.finishedAt === null) ? 1500 : false),
  });

export function useSuggester(orgId: string, corpusId: string) {
  return useQuery(suggesterQueryOptions(orgId, corpusId));
}
