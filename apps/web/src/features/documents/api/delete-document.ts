import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { corpusKey } from "./keys";

export const deleteDocument = (orgId: string, corpusId: string, documentId: string) =>
  api.delete<void>(`/orgs/${orgId}/corpora/${corpusId}/documents/${documentId}`);

/** Deletes a document for good (text, tokens and spans). */
export function useDeleteDocument(orgId: string, corpusId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (documentId: string) => deleteDocument(orgId, corpusId, documentId),
    onSettled: () => qc.invalidateQueries({ queryKey: corpusKey(orgId, corpusId) }),
  });
}
