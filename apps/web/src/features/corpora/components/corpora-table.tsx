import type { CorpusSummary } from "@tagloom/contracts";
import { createColumnHelper, flexRender } from "@tanstack/react-table";
import { useDataTable } from "@/components/ui/use-data-table";
import { Link } from "react-router";
import { DataTable } from "@/components/ui/data-table";
import { formatCount } from "@/lib/format";
import { formatDate } from "@/lib/dates";

const col = createColumnHelper<CorpusSummary>();
type TableMeta = { linkTo: (corpusId: string) => string };

// Defined once, outside the component: flexRender treats a cell function as a component, so a
// new function per render would remount every cell.
const columns = [
  col.accessor("name", {
    header: "Corpus",
    cell: (c) => (
      <div>
        <Link to={(c.table.options.meta as TableMeta).linkTo(c.row.original.id)} className="font-medium text-ink-800 underline-offset-2 hover:underline">
          {c.getValue()}
        </Link>
        {c.row.original.archivedAt ? <span className="ml-2 rounded bg-ink-50 px-1.5 py-0.5 text-xs text-ink-500">archived</span> : null}
        {c.row.original.description ? <p className="mt-0.5 line-clamp-1 text-xs text-ink-500">{c.row.original.description}</p> : null}
      </div>
    ),
  }),
  col.accessor("documentCount", { header: "Documents", cell: (c) => formatCount(c.getValue()) }),
  col.accessor("entityTypeCount", { header: "Entity types", cell: (c) => formatCount(c.getValue()) }),
  col.accessor("createdAt", { header: "Created", cell: (c) => <span className="text-ink-500">{formatDate(c.getValue())}</span> }),
];

/** The organization's corpora with their sizes; each name opens the corpus. */
export function CorporaTable({ corpora, linkTo }: { corpora: CorpusSummary[]; linkTo: (corpusId: string) => string }) {
  const meta: TableMeta = { linkTo };
  const table = useDataTable({ data: corpora, columns, meta, getRowId: (c) => c.id });
  return <DataTable table={table} flexRender={flexRender} caption="Corpora" />;
}
