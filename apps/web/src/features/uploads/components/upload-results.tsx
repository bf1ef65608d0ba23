import { type UploadFile, countOf, fileStateStates } from "@tagloom/contracts";
import { Notice, Skeleton } from "@/components/ui/card";
import { formatBytes, formatCount } from "@/lib/format";
import { useUpload } from "../api/get-upload";
import { FileProblems } from "./file-problems";
import { StateBadge } from "@/components/ui/state-badge";

export type LocalRefusal = { filename: string; sizeBytes: number; reason: string };

/** Per-file results as a list: what was imported and what was refused and why. */
export function FileResultList({ files, localRefusals = [] }: { files: UploadFile[]; localRefusals?: LocalRefusal[] }) {
  return (
    <ul className="divide-y divide-ink-50 rounded-md border border-ink-100 bg-white text-sm" aria-label="File results">
      {localRefusals.map((f) => (
        <li key={`local-${f.filename}`} className="flex flex-wrap items-start gap-x-3 gap-y-1 px-3 py-2">
          <span className="font-medium text-ink-800">{f.filename}</span>
          <span className="inline-flex rounded bg-rust-500/10 px-1.5 py-0.5 text-xs font-medium text-rust-500">Not sent</span>
          <span className="w-full text-rust-500">
            {f.filename} {f.reason}
          </span>
        </li>
      ))}
      {files.map((f) => (
        <li key={f.id} className="flex flex-wrap items-start gap-x-3 gap-y-1 px-3 py-2" data-state={f.state}>
          <span className="font-medium text-ink-800">{f.filename}</span>
          <StateBadge state={fileStateStates[f.state]} />
          <span className="text-xs text-ink-500">{formatBytes(f.sizeBytes)}</span>
          {f.state === "ready" ? (
            <span className="text-xs text-moss-500">
              {countOf(f.documentsCreated, "document")} imported
            </span>
          ) : null}
          {f.state === "failed" && f.error ? (
            <div className="w-full text-rust-500">
              {f.filename} {f.error}
              <FileProblems problems={f.problems} />
            </div>
          ) : null}
        </li>
      ))}
    </ul>
  );
}

/** The results of one upload, refreshed until every file is ready or failed. */
export function UploadResults({ orgId, corpusId, uploadId }: { orgId: string; corpusId: string; uploadId: string }) {
  const upload = useUpload(orgId, corpusId, uploadId);
  if (upload.isPending) return <Skeleton />;
  if (upload.isError) return <Notice tone="error">{upload.error.message}</Notice>;
  const { counts } = upload.data.upload;
  const pending = counts.queued + counts.processing;
  return (
    <div className="space-y-2">
      <p className="text-sm text-ink-700" aria-live="polite">
        {pending > 0 ? `${pending} of ${countOf(upload.data.files.length, "file")} still being read… ` : "All files read: "}
        {formatCount(counts.ready)} imported, {formatCount(counts.failed)} refused.
      </p>
      <FileResultList files={upload.data.files} />
    </div>
  );
}
