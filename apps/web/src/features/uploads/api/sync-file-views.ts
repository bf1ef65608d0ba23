import { type QueryClient, type QueryKey, useQuery, useQueryClient } from "@tanstack/react-query";
import type { CorpusDetail, FilePage, UploadResult } from "@tagloom/contracts";
import { type Answer, refreshTogether } from "@/lib/refresh-together";
import { getUpload, uploadQueryOptions } from "./get-upload";
import { corpusKey } from "./keys";

// What tells a file's state or what it produced: the corpus header's counts, the files table,
// upload results and the documents list.
const FILE_VIEWS = new Set(["detail", "files", "uploads", "documents"]);
const isFileView = (key: QueryKey) => FILE_VIEWS.has(String(key[4]));

/** One story: each file has one state in every answer, and the header counts what the files list counts. */
export function fileViewsAgree(answers: Answer[]): boolean {
  const states = new Map<string, string>();
  let pendingInHeader: number | null = null;
  let pendingInFiles: number | null = null;
  const see = (id: string, state: string) => {
    if ((states.get(id) ?? state) !== state) return false;
    states.set(id, state);
    return true;
  };
  for (const { queryKey, data } of answers) {
    const kind = String(queryKey[4]);
    if (kind === "detail") pendingInHeader = (data as CorpusDetail).pendingFiles;
    if (kind === "files") {
      const page = data as FilePage;
      pendingInFiles = page.counts.queued + page.counts.processing;
      if (!page.items.every((f) => see(f.id, f.state))) return false;
    }
    if (kind === "uploads" && !(data as UploadResult).files.every((f) => see(f.id, f.state))) return false;
  }
  return pendingInHeader === null || pendingInFiles === null || pendingInHeader === pendingInFiles;
}

/**
 * Fetches every view of the corpus's files again and shows the answers together (with the given
 * uploads' results even before a screen shows them).
 */
export function refreshFileViews(qc: QueryClient, orgId: string, corpusId: string, uploadIds: string[] = []): Promise<void> {
  return refreshTogether(qc, corpusKey(orgId, corpusId), isFileView, {
    extra: uploadIds.map((id) => ({ queryKey: uploadQueryOptions(orgId, corpusId, id).queryKey, queryFn: () => getUpload(orgId, corpusId, id) })),
    agree: fileViewsAgree,
  });
}

/**
 * While any file of the corpus is waiting or being read, refreshes all its views together each
 * second. They come from separate requests: on their own clocks one would say "imported" while
 * another still says "waiting". Used once, by the corpus frame, which knows whether files are pending.
 */
export function useFileViewsSync(orgId: string, corpusId: string, pending: boolean) {
  const qc = useQueryClient();
  return useQuery({
    queryKey: ["file-views-sync", orgId, corpusId],
    queryFn: async () => {
      await refreshFileViews(qc, orgId, corpusId);
      return true;
    },
    enabled: pending,
    refetchInterval: pending ? 1000 : false,
    staleTime: 0,
    // The clock's own fetching state must not re-render the frame: a re-render between the
    // publish and its notifications would show the new header beside the old results.
    notifyOnChangeProps: [],
  });
}
