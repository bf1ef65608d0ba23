import type { TrainingRun } from "@tagloom/contracts";
import { createColumnHelper, flexRender } from "@tanstack/react-table";
import { useDataTable } from "@/components/ui/use-data-table";
import { Link } from "react-router";
import { DataTable } from "@/components/ui/data-table";
import { paths } from "@/config/paths";
import { formatAgo } from "@/lib/dates";
import { RunStatus, score } from "./run-status";

const col = createColumnHelper<TrainingRun>();

function settingsOf(run: TrainingRun): string {
  const c = run.config;
  const parts = [`order ${c.order}`, `rare ≤ ${c.rare}`, `λ ${c.smoothing.emission}`];
  if (c.semi !== "none") parts.push(c.semi === "em" ? `EM × ${c.iterations}` : `sampling × ${c.iterations}`);
  if (c.positionBuckets.token.length || c.positionBuckets.sentence.length) parts.push("position-aware");
  parts.push(run.testSplit.kind === "corpus" ? "corpus test split" : `hold-out ${run.testSplit.percent} %`);
  return parts.join(" · ");
}

/** A corpus's runs, newest first, each linking to its page and to its tagger. */
export function RunsTable({ orgId, corpusId, runs }: { orgId: string; corpusId: string; runs: TrainingRun[] }) {
  const columns = [
    col.accessor("number", {
      header: "Run",
      cell: (c) => (
        <Link className="font-medium text-ink-900 hover:underline" to={paths.org.run.build(orgId, corpusId, c.row.original.id)}>
          Run {c.getValue()}
        </Link>
      ),
    }),
    col.accessor("status", { header: "State", cell: (c) => <RunStatus run={c.row.original} /> }),
    col.display({ id: "settings", header: "Settings", cell: (c) => <span className="text-xs text-ink-600">{settingsOf(c.row.original)}</span> }),
    col.display({
      id: "f1",
      header: "Test F1",
      cell: (c) => (c.row.original.evaluation ? <span className="tabular-nums">{score(c.row.original.evaluation.overall.f1)}</span> : "—"),
    }),
    col.display({
      id: "tagger",
      header: "Tagger",
      cell: (c) =>
        c.row.original.taggerId ? (
          <Link className="text-thread-700 hover:underline" to={paths.org.tagger.build(orgId, corpusId, c.row.original.taggerId)}>
            Open tagger
          </Link>
        ) : (
          "—"
        ),
    }),
    col.accessor("createdAt", { header: "Started", cell: (c) => formatAgo(c.getValue()) }),
  ];
  const table = useDataTable({ data: runs, columns, getRowId: (r) => r.id });
  return <DataTable table={table} flexRender={flexRender} caption="Training runs" />;
}
