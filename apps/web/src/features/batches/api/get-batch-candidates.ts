import type { DocumentListItem, Page } from "@tagloom/contracts";
import { infiniteQueryOptions, useInfiniteQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";

export type CandidateFilter = { q?: string; status?: "none" | "in_progress" | "submitted" | "gold" };

/** Documents of a corpus to pick for a batch, oldest first. */
export const getBatchCandidates = (orgId: string, corpusId: string, filter: CandidateFilter, cursor?: string) =>
  api.get<Page<DocumentListItem>>(`/orgs/${orgId}/corpora/${corpusId}/documents`, {
    query: { cursor, limit: 200, sort: "created", dir: "asc", q: filter.q, status: filter.status },
  });

export const batchCandidatesQueryOptions = (orgId: string, corpusId: string, filter: CandidateFilter) =>
  infiniteQueryOptions({
    queryKey: ["orgs", orgId, "corpora", corpusId, "batch-candidates", filter],
    queryFn: ({ pageParam }) => getBatchCandidates(orgId, corpusId, filter, pageParam),
    initialPageParam: undefined as string | undefined,
    getNextPageParam: (last) => last.nextCursor ?? undefined,
  });

export function useBatchCandidates(orgId: string, corpusId: string | null, filter: CandidateFilter) {
  return useInfiniteQuery({ ...batchCandidatesQueryOptions(orgId, corpusId ?? "", filter), enabled: corpusId !== null });
}
