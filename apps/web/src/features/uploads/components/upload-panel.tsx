import type { SpanMode } from "@tagloom/contracts";
import { type DragEvent, useRef, useState } from "react";
import { Button } from "@/components/ui/button";
import { Card, Notice, Skeleton } from "@/components/ui/card";
import { Field, Select } from "@/components/ui/field";
import { cn } from "@/lib/cn";
import { formatBytes, formatCount } from "@/lib/format";
import { useUploadLimits } from "../api/get-upload-limits";
import { useUploadFiles } from "../api/upload-files";
import { planUploads } from "./plan-uploads";
import { FileResultList, type LocalRefusal, UploadResults } from "./upload-results";
import { UserText } from "@/components/ui/user-text";

/**
 * Drop files here or pick them: text, PDF, DOCX, JSONL and column files, many at once. Shows
 * the limits and the personal-data caution, sends the files in as many requests as the limits
 * need, then follows each file until it is ready or refused with its reason.
 */
export function UploadPanel({ orgId, corpusId, disabledReason }: { orgId: string; corpusId: string; disabledReason?: string | null }) {
  const limits = useUploadLimits(orgId, corpusId);
  const upload = useUploadFiles(orgId, corpusId);
  const input = useRef<HTMLInputElement>(null);
  const [chosen, setChosen] = useState<File[]>([]);
  const [dragging, setDragging] = useState(false);
  const [spanMode, setSpanMode] = useState<SpanMode>("gold");
  const [defaultSplit, setDefaultSplit] = useState<"" | "train" | "test">("");
  const [uploadIds, setUploadIds] = useState<string[]>([]);
  const [localRefusals, setLocalRefusals] = useState<LocalRefusal[]>([]);
  const [error, setError] = useState<string | null>(null);
  const [progress, setProgress] = useState<{ done: number; total: number } | null>(null);

  const add = (files: FileList | null) => {
    if (!files?.length) return;
    // Copied now: the input's FileList is emptied in place when its value is reset below, and
    // React may run the updater later (when the panel already has an update pending).
    const picked = Array.from(files);
    setChosen((prev) => [...prev, ...picked]);
  };
  const onDrop = (e: DragEvent<HTMLDivElement>) => {
    e.preventDefault();
    setDragging(false);
    add(e.dataTransfer.files);
  };

  const send = async () => {
    if (!limits.data) return;
    setError(null);
    const { batches, refused } = planUploads(chosen, limits.data);
    setLocalRefusals(refused);
    setUploadIds([]);
    setProgress({ done: 0, total: batches.length });
    try {
      for (const [i, files] of batches.entries()) {
        const result = await upload.mutateAsync({ files, spanMode, defaultSplit });
        setUploadIds((ids) => [...ids, result.upload.id]);
        setProgress({ done: i + 1, total: batches.length });
      }
      setChosen([]);
    } catch (err) {
      setError((err as Error).message);
    } finally {
      setProgress(null);
    }
  };

  const total = chosen.reduce((n, f) => n + f.size, 0);
  return (
    <div className="space-y-4">
      <Card className="space-y-4">
        <div className="flex flex-wrap items-start justify-between gap-3">
          <h2 className="font-semibold text-ink-900">Upload documents</h2>
          {limits.data ? (
            <p className="text-xs text-ink-500" data-testid="upload-limits">
              Up to {formatBytes(limits.data.maxFileBytes)} per file, {formatCount(limits.data.maxFilesPerUpload)} files or{" "}
              {formatBytes(limits.data.maxUploadBytes)} per request (larger selections are sent in several), and{" "}
              {formatCount(limits.data.maxDocumentChars)} characters per document.
            </p>
          ) : null}
        </div>
        <Notice tone="warn">
          <strong>Documents may hold personal data.</strong> Upload only what your organization's rules allow you to process here. Admins
          and managers can delete a document or a whole corpus for good, and every upload and deletion is kept in the audit log.
        </Notice>
        {disabledReason ? <Notice tone="info">{disabledReason}</Notice> : null}
        {limits.isPending ? <Skeleton label="Reading the upload limits" /> : null}
        {limits.isError ? <Notice tone="error">{limits.error.message}</Notice> : null}
        <div
          role="group"
          aria-label="Drop files here"
          data-testid="drop-zone"
          onDragOver={(e) => {
            e.preventDefault();
            setDragging(true);
          }}
          onDragLeave={() => setDragging(false)}
          onDrop={onDrop}
          className={cn(
            "rounded-lg border-2 border-dashed border-ink-200 bg-ink-50/40 p-8 text-center transition-colors",
            dragging && "border-thread-500 bg-thread-100/60",
          )}
        >
          <p className="text-sm text-ink-700">Drop files here, or</p>
          <Button variant="secondary" className="mt-2" disabled={!!disabledReason} onClick={() => input.current?.click()}>
            Choose files…
          </Button>
          <input
            ref={input}
            type="file"
            multiple
            hidden
            aria-label="Files to upload"
            accept={limits.data?.extensions.join(",")}
            onChange={(e) => {
              add(e.target.files);
              e.target.value = "";
            }}
          />
          <p className="mt-3 text-xs text-ink-500">
            .txt (UTF-8) · .pdf (with a text layer) · .docx · .jsonl (one document per line: text, title, split, spans) · .conll / .bio (token and IOB tag per line)
          </p>
        </div>

        {chosen.length ? (
          <div className="space-y-3">
            <div className="flex items-center justify-between text-sm">
              <span className="text-ink-700">
                {formatCount(chosen.length)} file{chosen.length === 1 ? "" : "s"} chosen, {formatBytes(total)}
              </span>
              <Button size="sm" variant="ghost" onClick={() => setChosen([])}>
                Clear
              </Button>
            </div>
            <ul className="max-h-40 overflow-y-auto rounded border border-ink-100 bg-white px-3 py-2 text-xs text-ink-700" aria-label="Chosen files">
              {chosen.slice(0, 200).map((f, i) => (
                <li key={`${f.name}-${i}`}>
                  <UserText>{f.name}</UserText> <span className="text-ink-500">{formatBytes(f.size)}</span>
                </li>
              ))}
              {chosen.length > 200 ? <li className="text-ink-500">…and {formatCount(chosen.length - 200)} more</li> : null}
            </ul>
            <div className="grid gap-3 sm:grid-cols-2">
              <Field label="Spans in JSONL and column files become" hint="Gold spans count as accepted annotation; suggestions wait for an annotator.">
                {(id, d) => (
                  <Select id={id} aria-describedby={d} value={spanMode} onChange={(e) => setSpanMode(e.target.value as SpanMode)}>
                    <option value="gold">Gold</option>
                    <option value="suggested">Suggestions</option>
                  </Select>
                )}
              </Field>
              <Field label="Split for the new documents" hint="A JSONL line's own split wins.">
                {(id, d) => (
                  <Select id={id} aria-describedby={d} value={defaultSplit} onChange={(e) => setDefaultSplit(e.target.value as "" | "train" | "test")}>
                    <option value="">None</option>
                    <option value="train">Train</option>
                    <option value="test">Test</option>
                  </Select>
                )}
              </Field>
            </div>
            <Button onClick={() => void send()} busy={progress !== null} disabled={!limits.data || !!disabledReason}>
              Upload {formatCount(chosen.length)} file{chosen.length === 1 ? "" : "s"}
            </Button>
            {progress && progress.total > 1 ? (
              <p className="text-xs text-ink-500">
                Sending part {Math.min(progress.done + 1, progress.total)} of {progress.total}…
              </p>
            ) : null}
          </div>
        ) : null}
        {error ? <Notice tone="error">{error}</Notice> : null}
      </Card>

      {uploadIds.length || localRefusals.length ? (
        <section className="space-y-3" aria-label="Upload results">
          <h3 className="font-semibold text-ink-900">Results</h3>
          {localRefusals.length ? <FileResultList files={[]} localRefusals={localRefusals} /> : null}
          {uploadIds.map((id) => (
            <UploadResults key={id} orgId={orgId} corpusId={corpusId} uploadId={id} />
          ))}
        </section>
      ) : null}
    </div>
  );
}
