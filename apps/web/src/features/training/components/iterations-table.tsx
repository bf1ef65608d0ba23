import type { RunIteration } from "@tagloom/contracts";
import { createColumnHelper, flexRender } from "@tanstack/react-table";
import { useDataTable } from "@/components/ui/use-data-table";
import { DataTable } from "@/components/ui/data-table";
import { formatBytes } from "@/lib/format";
import { LineFigure } from "./line-chart";

const col = createColumnHelper<RunIteration>();
const columns = [
  col.accessor("iteration", { header: "Pass" }),
  col.accessor("logLikelihood", { header: "Log-likelihood", cell: (c) => <span className="tabular-nums">{c.getValue().toFixed(1)}</span> }),
  col.accessor("seconds", { header: "Seconds", cell: (c) => <span className="tabular-nums">{c.getValue().toFixed(2)}</span> }),
  col.accessor("statisticsBytes", { header: "Statistics held", cell: (c) => <span className="tabular-nums">{formatBytes(c.getValue())}</span> }),
];

/**
 * Passes over the documents without gold: the log-likelihood each pass started from (it should
 * rise, for EM never fall) and what the pass cost. Sampling holds a few bytes per token where EM
 * holds a full distribution, which the "statistics held" column shows.
 */
export function IterationsView({ iterations, method }: { iterations: RunIteration[]; method: "em" | "sample" | "none" }) {
  const table = useDataTable({ data: iterations, columns });
  if (iterations.length === 0) return <p className="text-sm text-ink-500">No passes yet.</p>;
  return (
    <div className="grid gap-3 lg:grid-cols-2">
      <LineFigure
        title={`Log-likelihood per pass (${method === "em" ? "EM" : "sampling"})`}
        data={iterations.map((i) => ({ pass: i.iteration, ll: i.logLikelihood }))}
        x="pass"
        xLabel="pass"
        series={[{ key: "ll", name: "log-likelihood", color: "#2f6f8f" }]}
        yFormat={(v) => v.toFixed(0)}
      />
      <LineFigure
        title="Statistics held per pass (KB)"
        data={iterations.map((i) => ({ pass: i.iteration, kb: i.statisticsBytes / 1024 }))}
        x="pass"
        xLabel="pass"
        series={[{ key: "kb", name: "kilobytes of statistics", color: "#b8661c" }]}
        yDomain={[0, "auto"]}
        yFormat={(v) => v.toFixed(1)}
      />
      <LineFigure
        title="Seconds per pass"
        data={iterations.map((i) => ({ pass: i.iteration, s: i.seconds }))}
        x="pass"
        xLabel="pass"
        series={[{ key: "s", name: "seconds", color: "#5b6b7d", dash: "6 4" }]}
        yDomain={[0, "auto"]}
        yFormat={(v) => v.toFixed(2)}
      />
      <DataTable table={table} flexRender={flexRender} caption="Passes over documents without gold" />
    </div>
  );
}
