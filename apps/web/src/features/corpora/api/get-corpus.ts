import type { CorpusDetail } from "@tagloom/contracts";
import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { corpusKey } from "./keys";

export const getCorpus = (orgId: string, corpusId: string) => api.get<CorpusDetail>(`/orgs/${orgId}/corpora/${corpusId}`);

export const corpusQueryOptions = (orgId: string, corpusId: string) =>
  queryOptions({
    queryKey: [...corpusKey(orgId, corpusId), "detail"],
    queryFn: () => getCorpus(orgId, corpusId),
  });

export function useCorpus(orgId: string, corpusId: string) {
  return useQuery(corpusQueryOptions(orgId, corpusId));
}
