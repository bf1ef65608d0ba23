import type { FileListQuery, FilePage } from "@tagloom/contracts";
import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { corpusKey } from "./keys";

export type FilesParams = Partial<Pick<FileListQuery, "state" | "cursor" | "uploadId">>;

export const getFiles = (orgId: string, corpusId: string, params: FilesParams) =>
  api.get<FilePage>(`/orgs/${orgId}/corpora/${corpusId}/files`, { query: { ...params, limit: 50 } });

export const filesQueryOptions = (orgId: string, corpusId: string, params: FilesParams) =>
  queryOptions({
    queryKey: [...corpusKey(orgId, corpusId), "files", params],
    queryFn: () => getFiles(orgId, corpusId, params),
    placeholderData: keepPreviousData,
  });

/**
 * Files of the corpus with counts per state. While any is queued or processing, the corpus frame
 * refreshes this list together with the header and upload results (see sync-file-views.ts).
 */
export function useFiles(orgId: string, corpusId: string, params: FilesParams) {
  return useQuery(filesQueryOptions(orgId, corpusId, params));
}
