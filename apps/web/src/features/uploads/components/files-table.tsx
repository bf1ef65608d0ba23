import { type FileState, type UploadFile, fileStateLabels, fileStateStates, fileStates } from "@tagloom/contracts";
import { createColumnHelper, flexRender } from "@tanstack/react-table";
import { useDataTable } from "@/components/ui/use-data-table";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { DataTable } from "@/components/ui/data-table";
import { EmptyState, Notice, Skeleton } from "@/components/ui/card";
import { StateBadge } from "@/components/ui/state-badge";
import { cn } from "@/lib/cn";
import { formatDateTime } from "@/lib/dates";
import { formatBytes, formatCount } from "@/lib/format";
import { useFiles } from "../api/get-files";
import { FileProblems } from "./file-problems";

const col = createColumnHelper<UploadFile>();
const columns = [
  col.accessor("filename", { header: "File", cell: (c) => <span className="font-medium">{c.getValue()}</span> }),
  col.accessor("state", { header: "State", cell: (c) => <StateBadge state={fileStateStates[c.getValue()]} /> }),
  col.accessor("sizeBytes", { header: "Size", cell: (c) => <span className="whitespace-nowrap text-ink-500">{formatBytes(c.getValue())}</span> }),
  col.accessor("documentsCreated", { header: "Documents", cell: (c) => (c.row.original.state === "ready" ? formatCount(c.getValue()) : "—") }),
  col.display({
    id: "reason",
    header: "Reason",
    cell: (c) =>
      c.row.original.error ? (
        <div className="max-w-xl text-rust-500">
          {c.row.original.error}
          <FileProblems problems={c.row.original.problems} />
        </div>
      ) : null,
  }),
  col.accessor("createdAt", { header: "Uploaded", cell: (c) => <span className="whitespace-nowrap text-ink-500">{formatDateTime(c.getValue())}</span> }),
];

const stateLabels: Record<FileState | "all", string> = { all: "All", ...fileStateLabels };

/** Every file uploaded to the corpus with its state; refreshes while files are queued or processing. */
export function FilesTable({ orgId, corpusId }: { orgId: string; corpusId: string }) {
  const [state, setState] = useState<FileState | "all">("all");
  const [cursors, setCursors] = useState<string[]>([]);
  const files = useFiles(orgId, corpusId, { state: state === "all" ? undefined : state, cursor: cursors[cursors.length - 1] });
  const table = useDataTable({ data: files.data?.items ?? [], columns, getRowId: (f) => f.id });
  const counts = files.data?.counts;
  const total = counts ? counts.queued + counts.processing + counts.ready + counts.failed : 0;
  return (
    <section className="space-y-3" aria-label="Files">
      <div className="flex flex-wrap items-center gap-1" role="tablist" aria-label="File state">
        {(["all", ...fileStates] as const).map((s) => (
          <button
            key={s}
            type="button"
            role="tab"
            aria-selected={state === s}
            onClick={() => {
              setState(s);
              setCursors([]);
            }}
            className={cn("rounded-md px-3 py-1 text-sm text-ink-700 hover:bg-ink-50", state === s && "bg-ink-50 font-medium text-ink-900")}
          >
            {stateLabels[s]} {counts ? <span className="text-ink-500">({formatCount(s === "all" ? total : counts[s])})</span> : null}
          </button>
        ))}
      </div>
      {files.isPending ? (
        <Skeleton shape="table" />
      ) : files.isError ? (
        <Notice tone="error">{files.error.message}</Notice>
      ) : files.data.items.length === 0 ? (
        <EmptyState title={state === "all" ? "No files uploaded yet" : `No ${stateLabels[state].toLowerCase()} files`} />
      ) : (
        <DataTable table={table} flexRender={flexRender} caption="Uploaded files" />
      )}
      <div className="flex gap-2">
        {cursors.length ? (
          <Button size="sm" variant="secondary" onClick={() => setCursors((c) => c.slice(0, -1))}>
            Newer files
          </Button>
        ) : null}
        {files.data?.nextCursor ? (
          <Button size="sm" variant="secondary" onClick={() => setCursors((c) => [...c, files.data!.nextCursor!])}>
            Older files
          </Button>
        ) : null}
      </div>
    </section>
  );
}
