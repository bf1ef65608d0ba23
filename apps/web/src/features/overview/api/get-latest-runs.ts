import type { Page, TrainingRun } from "@tagloom/contracts";
import { queryOptions, useQuery } from "@tanstack/react-query";
import { corpusKey } from "@/features/corpora/api/keys";
import { api } from "@/lib/api-client";

/** The few newest training runs of a corpus, for the overview (the runs screen pages through all of them). */
export const latestRunsQueryOptions = (orgId: string, corpusId: string, limit = 3) =>
  queryOptions({
    queryKey: [...corpusKey(orgId, corpusId), "runs", "latest", limit],
    queryFn: () => api.get<Page<TrainingRun>>(`/orgs/${orgId}/corpora/${corpusId}/runs`, { query: { limit } }),
  });

export function useLatestRuns(orgId: string, corpusId: string, limit = 3) {
  return useQuery(latestRunsQueryOptions(orgId, corpusId, limit));
}
