import type { Page, ReviewListItem } from "@tagloom/contracts";
import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";

export const getReviewList = (orgId: string, filter: { corpusId?: string; batchId?: string } = {}) =>
  api.get<Page<ReviewListItem>>(`/orgs/${orgId}/review`, { query: filter });

export const reviewListQueryOptions = (orgId: string, filter: { corpusId?: string; batchId?: string } = {}) =>
  queryOptions({ queryKey: ["orgs", orgId, "review", "list", filter], queryFn: () => getReviewList(orgId, filter), staleTime: 0 });

export function useReviewList(orgId: string, filter: { corpusId?: string; batchId?: string } = {}) {
  return useQuery(reviewListQueryOptions(orgId, filter));
}
