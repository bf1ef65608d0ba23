import type { SpanMode, UploadResult } from "@tagloom/contracts";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { corpusKey } from "./keys";
import { refreshFileViews } from "./sync-file-views";
import { ownErrorMeta } from "@/lib/query-client";

export type UploadRequest = { files: File[]; spanMode: SpanMode; defaultSplit: "" | "train" | "test" };

/** Sends one upload: the files in the `files` field and the options as form fields. */
export function uploadFiles(orgId: string, corpusId: string, req: UploadRequest): Promise<UploadResult> {
  const form = new FormData();
  form.set("spanMode", req.spanMode);
  form.set("defaultSplit", req.defaultSplit);
  for (const f of req.files) form.append("files", f, f.name);
  return api.post<UploadResult>(`/orgs/${orgId}/corpora/${corpusId}/uploads`, form);
}

export function useUploadFiles(orgId: string, corpusId: string) {
  const qc = useQueryClient();
  return useMutation({
    meta: ownErrorMeta,
    // The new upload's results, the files table and the header's counts arrive together.
    mutationFn: async (req: UploadRequest) => {
      const result = await uploadFiles(orgId, corpusId, req);
      await refreshFileViews(qc, orgId, corpusId, [result.upload.id]);
      return result;
    },
    onError: () => qc.invalidateQueries({ queryKey: corpusKey(orgId, corpusId) }),
  });
}
