import type { UploadResult } from "@tagloom/contracts";
import { queryOptions, useQuery, useQueryClient } from "@tanstack/react-query";
import { useEffect } from "react";
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

/**
 * One upload with its files, refreshed while any file is queued or processing. Each time its
 * counts change, everything else about the corpus (its header, files table and documents) is
 * fetched again, so the screen never shows a file ready in one place and queued in another.
 */
export function useUpload(orgId: string, corpusId: string, uploadId: string) {
  const qc = useQueryClient();
  const query = useQuery(uploadQueryOptions(orgId, corpusId, uploadId));
  const c = query.data?.upload.counts;
  const signature = c ? `${c.queued}/${c.processing}/${c.ready}/${c.failed}` : null;
  useEffect(() => {
    if (!signature) return;
    const own = uploadQueryOptions(orgId, corpusId, uploadId).queryKey;
    void qc.invalidateQueries({ queryKey: corpusKey(orgId, corpusId), predicate: (q) => q.queryKey.length !== own.length || q.queryKey[own.length - 1] !== uploadId });
  }, [qc, orgId, corpusId, uploadId, signature]);
  return query;
}
