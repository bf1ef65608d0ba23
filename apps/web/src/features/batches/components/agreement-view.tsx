import type { BatchAgreement, PairAgreement } from "@tagloom/contracts";
import type { ReactNode } from "react";
import { createColumnHelper, flexRender } from "@tanstack/react-table";
import { Bar, BarChart, CartesianGrid, LabelList, Legend, ResponsiveContainer, XAxis, YAxis } from "recharts";
import { DataTable } from "@/components/ui/data-table";
import { useDataTable } from "@/components/ui/use-data-table";

const fmt = (x: number) => x.toFixed(2);
const pairName = (p: PairAgreement) => `${p.annotatorA.name} & ${p.annotatorB.name}`;

type Row = { key: string; pair: string; documents: number; matched: number | null; onlyA: number | null; onlyB: number | null; f1: number; kappa: number; total: boolean };
const col = createColumnHelper<Row>();
const count = (v: number | null) => (v === null ? "" : v);
const right = (v: ReactNode, strong = false) => <span className={strong ? "block text-right font-medium tabular-nums" : "block text-right tabular-nums"}>{v}</span>;
const columns = [
  col.accessor("pair", { header: "Pair", cell: (c) => <span className={c.row.original.total ? "font-semibold" : "font-medium text-ink-800"}>{c.getValue()}</span> }),
  col.accessor("documents", { header: () => right("Documents"), cell: (c) => right(c.getValue()) }),
  col.accessor("matched", { header: () => right("Spans alike"), cell: (c) => right(count(c.getValue())) }),
  col.accessor("onlyA", { header: () => right("Only first"), cell: (c) => right(count(c.getValue())) }),
  col.accessor("onlyB", { header: () => right("Only second"), cell: (c) => right(count(c.getValue())) }),
  col.accessor("f1", { header: () => right("Entity F1"), cell: (c) => right(fmt(c.getValue()), true) }),
  col.accessor("kappa", { header: () => right("Kappa"), cell: (c) => right(fmt(c.getValue()), true) }),
];

/**
 * Agreement of each pair of annotators on the documents both finished: entity-level F1 (same
 * span, same type) and Cohen's kappa on each word's label, as a table and a bar chart.
 */
export function AgreementView({ agreement }: { agreement: BatchAgreement }) {
  const overall = agreement.overall;
  const rows: Row[] = [
    ...agreement.pairs.map((p) => ({ key: `${p.annotatorA.userId}-${p.annotatorB.userId}`, pair: pairName(p), documents: p.documents, matched: p.matched, onlyA: p.onlyA, onlyB: p.onlyB, f1: p.f1, kappa: p.kappa, total: false })),
    ...(overall ? [{ key: "all", pair: "All pairs", documents: overall.documents, matched: null, onlyA: null, onlyB: null, f1: overall.f1, kappa: overall.kappa, total: true }] : []),
  ];
  const table = useDataTable({ data: rows, columns, getRowId: (r) => r.key });
  if (!overall) {
    return <p className="text-sm text-ink-500">No document has been finished by two annotators yet. Give documents to two or more annotators to measure agreement.</p>;
  }
  return (
    // One column below 1024 px; min-w-0 lets the table box scroll sideways instead of widening the page.
    <div className="grid grid-cols-1 gap-6 lg:grid-cols-[minmax(0,1fr)_24rem]">
      <div className="min-w-0 space-y-2">
        <DataTable table={table} flexRender={flexRender} caption="Agreement per pair of annotators" rowClassName={(r) => (r.total ? "bg-ink-50/50" : undefined)} />
        <p className="text-xs text-ink-500">
          Entity F1 counts a span as agreed only with the same start, end and type. Kappa compares each word's label (begins, inside or outside a span of a type) and
          discounts agreement expected by chance; 1 is perfect, 0 is chance.
        </p>
      </div>
      <AgreementChart pairs={agreement.pairs} />
    </div>
  );
}

/** Bars of F1 and kappa per pair (recharts), as wide as their column; the numbers are in the table too. */
export function AgreementChart({ pairs }: { pairs: PairAgreement[] }) {
  const data = pairs.map((p) => ({ pair: pairName(p), f1: Math.round(p.f1 * 100) / 100, kappa: Math.round(p.kappa * 100) / 100 }));
  const height = pairs.length * 56 + 64;
  return (
    <figure className="min-w-0 rounded-lg border border-ink-100 bg-white p-3">
      <div role="img" aria-label="Agreement per pair: entity F1 and kappa" style={{ height }}>
        <ResponsiveContainer width="100%" height="100%" initialDimension={{ width: 360, height }}>
          <BarChart data={data} layout="vertical" margin={{ top: 4, right: 36, bottom: 4, left: 4 }} barGap={2}>
            <CartesianGrid stroke="#d9e4ef" horizontal={false} />
            <XAxis type="number" domain={[0, 1]} ticks={[0, 0.25, 0.5, 0.75, 1]} fontSize={11} stroke="#86a3c2" />
            <YAxis type="category" dataKey="pair" width={110} fontSize={11} stroke="#86a3c2" tickFormatter={(s: string) => (s.length > 18 ? `${s.slice(0, 17)}…` : s)} />
            {/* Legend words in ink: in the bars' own colours the orange would be too faint to read. */}
            <Legend verticalAlign="top" height={24} wrapperStyle={{ fontSize: 12 }} formatter={(value: string) => <span className="text-ink-800">{value}</span>} />
            <Bar dataKey="f1" name="Entity F1" fill="#1d3557" barSize={12} isAnimationActive={false}>
              <LabelList dataKey="f1" position="right" fontSize={10} formatter={(v) => (typeof v === "number" ? fmt(v) : String(v))} />
            </Bar>
            <Bar dataKey="kappa" name="Kappa" fill="#f4a259" barSize={12} isAnimationActive={false}>
              <LabelList dataKey="kappa" position="right" fontSize={10} fill="#8a4a12" formatter={(v) => (typeof v === "number" ? fmt(v) : String(v))} />
            </Bar>
          </BarChart>
        </ResponsiveContainer>
      </div>
    </figure>
  );
}
