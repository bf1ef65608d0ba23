import type { DocumentDetail } from "@tagloom/contracts";
import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { documentsKey } from "./keys";

export const getDocument = (orgId: string, corpusId: string, documentId: string) =>
  api.get<DocumentDetail>(`/orgs/${orgId}/corpora/${corpusId}/documents/${documentId}`);

export const documentQueryOptions = (orgId: string, corpusId: string, documentId: string) =>
  queryOptions({ queryKey: [...documentsKey(orgId, corpusId), "one", documentId], queryFn: () => getDocument(orgId, corpusId, documentId) });

export function useDocument(orgId: string, corpusId: string, documentId: string) {
  return useQuery(documentQueryOptions(orgId, corpusId, documentId));
}
