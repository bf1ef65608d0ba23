import type { BatchSummary, Page } from "@tagloom/contracts";
import { infiniteQueryOptions, useInfiniteQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";

export const getBatches = (orgId: string, cursor?: string) => api.get<Page<BatchSummary>>(`/orgs/${orgId}/batches`, { query: { cursor, limit: 50 } });

export const batchesQueryOptions = (orgId: string) =>
  infiniteQueryOptions({
    queryKey: ["orgs", orgId, "batches", "list"],
    queryFn: ({ pageParam }) => getBatches(orgId, pageParam),
    initialPageParam: undefined as string | undefined,
    getNextPageParam: (last) => last.nextCursor ?? undefined,
  });

export function useBatches(orgId: string, { enabled = true }: { enabled?: boolean } = {}) {
  return useInfiniteQuery({ ...batchesQueryOptions(orgId), enabled });
}
