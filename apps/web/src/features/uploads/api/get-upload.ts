import type { UploadResult } from "@tagloom/contracts";
import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { corpusKey } from "./keys";

export const getUpload = (orgId: string, corpusId: string, uploadId: string) => api.get<UploadResult>(`/orgs/${orgId}/corpora/${corpusId}/uploads/${uploadId}`);

export const uploadQueryOptions = (orgId: string, corpusId: string, uploadId: string) =>
  queryOptions({
    queryKey: [...corpusKey(orgId, corpusId), "uploads", uploadId],
    queryFn: () => getUpload(orgId, corpusId, uploadId),
    // Poll until every file is ready or failed.
    refetchInterval: (q) => {
      const c = q.state.data?.upload.counts;
      return c && c.queued + c.processing > 0 ? 1000 : false;
    },
  });

/** One upload with its files, refreshed while any file is queued or processing. */
export function useUpload(orgId: string, corpusId: string, uploadId: string) {
  return useQuery(uploadQueryOptions(orgId, corpusId, uploadId));
}
