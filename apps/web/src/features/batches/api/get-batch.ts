import type { BatchDetail } from "@tagloom/contracts";
import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";

export const getBatch = (orgId: string, corpusId: string, batchId: string) => api.get<BatchDetail>(`/orgs/${orgId}/corpora/${corpusId}/batches/${batchId}`);

export const batchQueryOptions = (orgId: string, corpusId: string, batchId: string) =>
  queryOptions({ queryKey: ["orgs", orgId, "batches", batchId], queryFn: () => getBatch(orgId, corpusId, batchId), staleTime: 5_000 });

export function useBatch(orgId: string, corpusId: string, batchId: string) {
  return useQuery(batchQueryOptions(orgId, corpusId, batchId));
}
