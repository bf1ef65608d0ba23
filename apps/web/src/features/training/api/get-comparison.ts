import type { ComparisonDocument, TaggerComparison } from "@tagloom/contracts";
import { useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { corpusApi, taggersKey } from "./keys";

/** Taggers A and B scored on A's test documents. */
export function useComparison(orgId: string, corpusId: string, a: string, b: string) {
  return useQuery({
    queryKey: [...taggersKey(orgId, corpusId), a, "compare", b],
    queryFn: () => api.get<TaggerComparison>(`${corpusApi(orgId, corpusId)}/taggers/${a}/compare/${b}`),
    staleTime: Infinity,
  });
}

/** One test document with gold, A's and B's spans. */
export function useComparisonDocument(orgId: string, corpusId: string, a: string, b: string, documentId: string) {
  return useQuery({
    queryKey: [...taggersKey(orgId, corpusId), a, "compare", b, documentId],
    queryFn: () => api.get<ComparisonDocument>(`${corpusApi(orgId, corpusId)}/taggers/${a}/compare/${b}/documents/${documentId}`),
    staleTime: Infinity,
  });
}
