import type { Tagger } from "@tagloom/contracts";
import { createColumnHelper, flexRender } from "@tanstack/react-table";
import { useDataTable } from "@/components/ui/use-data-table";
import { Link } from "react-router";
import { DataTable } from "@/components/ui/data-table";
import { paths } from "@/config/paths";
import { formatAgo } from "@/lib/dates";
import { score } from "./run-status";

const col = createColumnHelper<Tagger>();

/** A corpus's taggers with their headline test scores. */
export function TaggersTable({ orgId, corpusId, taggers, suggesterId }: { orgId: string; corpusId: string; taggers: Tagger[]; suggesterId?: string | null }) {
  const columns = [
    col.accessor("label", {
      header: "Tagger",
      cell: (c) => (
        <span className="inline-flex items-center gap-2">
          <Link className="font-medium text-ink-900 hover:underline" to={paths.org.tagger.build(orgId, corpusId, c.row.original.id)}>
            {c.getValue()}
          </Link>
          {suggesterId === c.row.original.id ? <span className="rounded bg-thread-100 px-1.5 text-xs text-thread-700">suggester</span> : null}
        </span>
      ),
    }),
    col.display({ id: "f1", header: "F1", cell: (c) => <span className="tabular-nums">{score(c.row.original.evaluation.overall.f1)}</span> }),
    col.display({ id: "p", header: "Precision", cell: (c) => <span className="tabular-nums">{score(c.row.original.evaluation.overall.precision)}</span> }),
    col.display({ id: "r", header: "Recall", cell: (c) => <span className="tabular-nums">{score(c.row.original.evaluation.overall.recall)}</span> }),
    col.display({
      id: "cv",
      header: "Cross-validated F1",
      cell: (c) => {
        const cv = c.row.original.evaluation.crossValidation;
        return cv ? <span className="tabular-nums">{`${score(cv.f1.mean)} ± ${score(cv.f1.std)}`}</span> : "—";
      },
    }),
    col.display({ id: "docs", header: "Test documents", cell: (c) => c.row.original.evaluation.documents }),
    col.accessor("createdAt", { header: "Made", cell: (c) => formatAgo(c.getValue()) }),
  ];
  const table = useDataTable({ data: taggers, columns, getRowId: (t) => t.id });
  return <DataTable table={table} flexRender={flexRender} caption="Taggers" />;
}
