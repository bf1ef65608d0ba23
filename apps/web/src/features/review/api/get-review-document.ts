import type { ReviewDocumentView } from "@tagloom/contracts";
import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";

export const getReviewDocument = (orgId: string, corpusId: string, batchId: string, documentId: string) =>
  api.get<ReviewDocumentView>(`/orgs/${orgId}/corpora/${corpusId}/batches/${batchId}/documents/${documentId}/review`);

export const reviewDocumentQueryOptions = (orgId: string, corpusId: string, batchId: string, documentId: string) =>
  queryOptions({
    queryKey: ["orgs", orgId, "review", batchId, documentId],
    queryFn: () => getReviewDocument(orgId, corpusId, batchId, documentId),
    staleTime: 0,
  });

export function useReviewDocument(orgId: string, corpusId: string, batchId: string, documentId: string) {
  return useQuery(reviewDocumentQueryOptions(orgId, corpusId, batchId, documentId));
}
