import type { UploadResult } from "@tagloom/contracts";
import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { corpusKey } from "./keys";

export const getUpload = (orgId: string, corpusId: string, uploadId: string) => api.get<UploadResult>(`/orgs/${orgId}/corpora/${corpusId}/uploads/${uploadId}`);

export const uploadQueryOptions = (orgId: string, corpusId: string, uploadId: string) =>
  queryOptions({
    queryKey: [...corpusKey(orgId, corpusId), "uploads", uploadId],
    queryFn: () => getUpload(orgId, corpusId, uploadId),
  });

/**
 * One upload with its files. It is not polled on its own: while files are pending, the corpus
 * frame refreshes it together with the files table and the header (see sync-file-views.ts).
 */
export function useUpload(orgId: string, corpusId: string, uploadId: string) {
  return useQuery(uploadQueryOptions(orgId, corpusId, uploadId));
}
