import type { BatchAgreement } from "@tagloom/contracts";
import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";

export const getBatchAgreement = (orgId: string, corpusId: string, batchId: string) =>
  api.get<BatchAgreement>(`/orgs/${orgId}/corpora/${corpusId}/batches/${batchId}/agreement`);

export const batchAgreementQueryOptions = (orgId: string, corpusId: string, batchId: string) =>
  queryOptions({ queryKey: ["orgs", orgId, "batches", batchId, "agreement"], queryFn: () => getBatchAgreement(orgId, corpusId, batchId), staleTime: 5_000 });

export function useBatchAgreement(orgId: string, corpusId: string, batchId: string) {
  return useQuery(batchAgreementQueryOptions(orgId, corpusId, batchId));
}
