import type { Span } from "@tagloom/contracts";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { ownErrorMeta } from "@/lib/query-client";

/** Makes the settled spans the document's gold and accepts every assignment of it in the batch. */
export const settleDocument = (orgId: string, corpusId: string, batchId: string, documentId: string, spans: Span[]) =>
  api.post<void>(`/orgs/${orgId}/corpora/${corpusId}/batches/${batchId}/documents/${documentId}/settle`, { spans });

export function useSettleDocument(orgId: string, corpusId: string, batchId: string, documentId: string) {
  const qc = useQueryClient();
  return useMutation({
    meta: ownErrorMeta,
    mutationFn: (spans: Span[]) => settleDocument(orgId, corpusId, batchId, documentId, spans),
    onSettled: () => {
      void qc.invalidateQueries({ queryKey: ["orgs", orgId, "review"] });
      void qc.invalidateQueries({ queryKey: ["orgs", orgId, "batches"] });
    },
  });
}
