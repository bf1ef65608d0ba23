import { type BatchSummary, batchStateOf, batchStateStates } from "@tagloom/contracts";
import { createColumnHelper, flexRender } from "@tanstack/react-table";
import { useDataTable } from "@/components/ui/use-data-table";
import { Link } from "react-router";
import { DataTable } from "@/components/ui/data-table";
import { DueDate } from "@/components/ui/due-date";
import { StateBadge } from "@/components/ui/state-badge";
import { ProgressBar } from "./progress-bar";

const col = createColumnHelper<BatchSummary>();

/** Batches with their corpus, due date and progress; each links to its page. */
export function BatchesTable({ batches, corpusName, linkTo }: { batches: BatchSummary[]; corpusName: (id: string) => string; linkTo: (b: BatchSummary) => string }) {
  const columns = [
    col.accessor("name", {
      header: "Batch",
      cell: (c) => (
        <Link to={linkTo(c.row.original)} className="font-medium text-ink-800 hover:underline">
          {c.getValue()}
        </Link>
      ),
    }),
    col.accessor("corpusId", { header: "Corpus", cell: (c) => corpusName(c.getValue()) }),
    col.display({ id: "state", header: "State", cell: (c) => <StateBadge state={batchStateStates[batchStateOf(c.row.original.assignments)]} /> }),
    col.accessor("dueDate", { header: "Due", cell: (c) => <DueDate day={c.getValue()} /> }),
    col.accessor("documentCount", { header: "Documents", cell: (c) => `${c.row.original.documentsSettled} of ${c.getValue()} settled` }),
    col.accessor("annotatorsPerDocument", { header: "Per document" }),
    col.display({ id: "progress", header: "Assignments", cell: (c) => <ProgressBar counts={c.row.original.assignments} label={c.row.original.name} /> }),
    col.accessor("createdBy", { header: "Made by", cell: (c) => c.getValue() ?? "—" }),
  ];
  const table = useDataTable({ data: batches, columns, getRowId: (b) => b.id });
  return <DataTable table={table} flexRender={flexRender} caption="Batches" />;
}
