import type { CorpusSummary, Page } from "@tagloom/contracts";
import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";

/** The corpora a batch can be made in (not archived). */
export const getBatchCorpora = (orgId: string) => api.get<Page<CorpusSummary>>(`/orgs/${orgId}/corpora`, { query: { limit: 200 } });

export const batchCorporaQueryOptions = (orgId: string) =>
  queryOptions({ queryKey: ["orgs", orgId, "corpora", "for-batches"], queryFn: () => getBatchCorpora(orgId) });

export function useBatchCorpora(orgId: string) {
  return useQuery(batchCorporaQueryOptions(orgId));
}
