import { type QueueItem, assignmentStateStates } from "@tagloom/contracts";
import { createColumnHelper, flexRender } from "@tanstack/react-table";
import { useDataTable } from "@/components/ui/use-data-table";
import { Link } from "react-router";
import { DataTable } from "@/components/ui/data-table";
import { DueDate } from "@/components/ui/due-date";
import { StateBadge } from "@/components/ui/state-badge";
import { formatAgo } from "@/lib/dates";
import { formatCount } from "@/lib/format";
import { UserText } from "@/components/ui/user-text";

const col = createColumnHelper<QueueItem>();

type Props = {
  items: QueueItem[];
  linkTo: (item: QueueItem) => string;
  /** The "Done" list: when each was last changed instead of its due date. */
  finished?: boolean;
  caption?: string;
};

/** My assignments, unfinished (the queue) or finished (the "Done" list); each row opens the workspace. */
export function QueueTable({ items, linkTo, finished = false, caption = "My queue" }: Props) {
  const columns = [
    col.accessor("documentTitle", {
      header: "Document",
      cell: (c) => (
        <Link to={linkTo(c.row.original)} className="font-medium text-ink-800 hover:underline">
          <UserText>{c.getValue() || "Untitled"}</UserText>
        </Link>
      ),
    }),
    col.accessor("corpusName", { header: "Corpus" }),
    col.accessor("batchName", { header: "Batch" }),
    col.accessor("tokenCount", { header: "Words", cell: (c) => formatCount(c.getValue()) }),
    finished
      ? col.accessor("updatedAt", { id: "finishedAt", header: "Last change", cell: (c) => <span className="whitespace-nowrap text-ink-500">{formatAgo(c.getValue())}</span> })
      : col.accessor("dueDate", {
          header: "Due",
          cell: (c) => <DueDate day={c.getValue()} />,
        }),
    col.accessor("state", {
      header: "State",
      cell: (c) => (
        <span>
          <StateBadge state={assignmentStateStates[c.getValue()]} />
          {c.row.original.reviewComment && c.getValue() === "returned" ? <span className="block text-xs text-ink-500">“{c.row.original.reviewComment}”</span> : null}
        </span>
      ),
    }),
  ];
  const table = useDataTable({ data: items, columns, getRowId: (r) => r.assignmentId });
  return <DataTable table={table} flexRender={flexRender} caption={caption} />;
}
