import type { BatchSummary, CreateBatchInput } from "@tagloom/contracts";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { ownErrorMeta } from "@/lib/query-client";

export const createBatch = (orgId: string, corpusId: string, input: CreateBatchInput) =>
  api.post<BatchSummary>(`/orgs/${orgId}/corpora/${corpusId}/batches`, input);

export function useCreateBatch(orgId: string) {
  const qc = useQueryClient();
  return useMutation({
    meta: ownErrorMeta,
    mutationFn: ({ corpusId, input }: { corpusId: string; input: CreateBatchInput }) => createBatch(orgId, corpusId, input),
    onSuccess: () => qc.invalidateQueries({ queryKey: ["orgs", orgId, "batches"] }),
  });
}
