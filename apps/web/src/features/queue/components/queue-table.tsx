import { type QueueItem, assignmentStateLabels } from "@tagloom/contracts";
import { createColumnHelper, flexRender, getCoreRowModel, useReactTable } from "@tanstack/react-table";
import { Link } from "react-router";
import { DataTable } from "@/components/ui/data-table";
import { cn } from "@/lib/cn";

const col = createColumnHelper<QueueItem>();

function dueLabel(due: string | null, today: string): { text: string; late: boolean } {
  if (!due) return { text: "—", late: false };
  return { text: due < today ? `${due} (overdue)` : due, late: due < today };
}

/** My unfinished assignments; each row opens the workspace. */
export function QueueTable({ items, linkTo }: { items: QueueItem[]; linkTo: (item: QueueItem) => string }) {
  const today = new Date().toISOString().slice(0, 10);
  const columns = [
    col.accessor("documentTitle", {
      header: "Document",
      cell: (c) => (
        <Link to={linkTo(c.row.original)} className="font-medium text-ink-800 hover:underline">
          {c.getValue() || "Untitled"}
        </Link>
      ),
    }),
    col.accessor("corpusName", { header: "Corpus" }),
    col.accessor("batchName", { header: "Batch" }),
    col.accessor("tokenCount", { header: "Words", cell: (c) => c.getValue().toLocaleString("en") }),
    col.accessor("dueDate", {
      header: "Due",
      cell: (c) => {
        const d = dueLabel(c.getValue(), today);
        return <span className={cn(d.late && "font-medium text-rust-500")}>{d.text}</span>;
      },
    }),
    col.accessor("state", {
      header: "State",
      cell: (c) => (
        <span>
          <span className={cn("font-medium", c.getValue() === "returned" && "text-rust-500")}>{assignmentStateLabels[c.getValue()]}</span>
          {c.row.original.reviewComment && c.getValue() === "returned" ? <span className="block text-xs text-ink-500">“{c.row.original.reviewComment}”</span> : null}
        </span>
      ),
    }),
  ];
  const table = useReactTable({ data: items, columns, getCoreRowModel: getCoreRowModel(), getRowId: (r) => r.assignmentId });
  return <DataTable table={table} flexRender={flexRender} caption="My queue" />;
}
