import type { DocumentListItem, DocumentListQuery, Page } from "@tagloom/contracts";
import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { documentsKey } from "./keys";

/** One page of the Documents table; `cursor` comes from the previous page's nextCursor. */
export type DocumentsParams = Omit<DocumentListQuery, "cursor" | "limit"> & { cursor?: string | undefined; limit?: number };

export const getDocuments = (orgId: string, corpusId: string, params: DocumentsParams) =>
  api.get<Page<DocumentListItem>>(`/orgs/${orgId}/corpora/${corpusId}/documents`, { query: { limit: 50, ...params } });

export const documentsQueryOptions = (orgId: string, corpusId: string, params: DocumentsParams, refetchMs: number | false = false) =>
  queryOptions({
    queryKey: [...documentsKey(orgId, corpusId), params],
    queryFn: () => getDocuments(orgId, corpusId, params),
    placeholderData: keepPreviousData,
    refetchInterval: refetchMs,
  });

/** A page of documents; `refetchMs` keeps it fresh while files are still being processed. */
export function useDocuments(orgId: string, corpusId: string, params: DocumentsParams, refetchMs: number | false = false) {
  return useQuery(documentsQueryOptions(orgId, corpusId, params, refetchMs));
}
