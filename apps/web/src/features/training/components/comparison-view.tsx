import type { TaggerComparison } from "@tagloom/contracts";
import { createColumnHelper, flexRender } from "@tanstack/react-table";
import { Link } from "react-router";
import { Card, Notice } from "@/components/ui/card";
import { DataTable } from "@/components/ui/data-table";
import { useDataTable } from "@/components/ui/use-data-table";
import { paths } from "@/config/paths";
import { score } from "./run-status";
import { UserText } from "@/components/ui/user-text";

type Row = { type: string; a: { precision: number; recall: number; f1: number; support: number }; b: { precision: number; recall: number; f1: number; support: number }; f1Difference: number };
const col = createColumnHelper<Row>();

const signed = (x: number) => `${x > 0 ? "+" : x < 0 ? "−" : "±"}${Math.abs(x).toFixed(3)}`;

/**
 * Two taggers on the same test documents: per-type scores side by side, the F1 difference with
 * its paired-bootstrap interval and p-value, and the documents where they disagree most.
 */
export function ComparisonView({ orgId, corpusId, comparison: c }: { orgId: string; corpusId: string; comparison: TaggerComparison }) {
  const columns = [
    col.accessor("type", { header: "Type", cell: (x) => <span className="font-mono text-xs">{x.getValue()}</span> }),
    col.display({ id: "support", header: "Support", cell: (x) => x.row.original.a.support }),
    col.display({ id: "pa", header: "P (A)", cell: (x) => score(x.row.original.a.precision) }),
    col.display({ id: "ra", header: "R (A)", cell: (x) => score(x.row.original.a.recall) }),
    col.display({ id: "fa", header: "F1 (A)", cell: (x) => <span className="font-medium">{score(x.row.original.a.f1)}</span> }),
    col.display({ id: "pb", header: "P (B)", cell: (x) => score(x.row.original.b.precision) }),
    col.display({ id: "rb", header: "R (B)", cell: (x) => score(x.row.original.b.recall) }),
    col.display({ id: "fb", header: "F1 (B)", cell: (x) => <span className="font-medium">{score(x.row.original.b.f1)}</span> }),
    col.accessor("f1Difference", { header: "B − A", cell: (x) => <span className="tabular-nums">{signed(x.getValue())}</span> }),
  ];
  const rows: Row[] = [{ type: "all types", a: c.overall.a, b: c.overall.b, f1Difference: c.overall.f1Difference }, ...c.types];
  const table = useDataTable({ data: rows, columns, getRowId: (r) => r.type });
  const bs = c.bootstrap;
  return (
    <div className="space-y-4">
      <div>
        <h2 className="text-lg font-semibold text-ink-900">
          A: {c.a.label} · B: {c.b.label}
        </h2>
        <p className="text-sm text-ink-500">Both scored on the same {c.testDocuments} test documents (the test split of A's run).</p>
      </div>
      <Card>
        <h3 className="mb-1 font-semibold text-ink-900">F1 difference (B − A): {signed(c.overall.f1Difference)}</h3>
        {/*
         * Paired bootstrap over test documents: resample documents with replacement, score both
         * taggers on each resample, and read the interval and the share of resamples where B does
         * not beat A. Berg-Kirkpatrick, Burkett & Klein (2012), "An Empirical Investigation of
         * Statistical Significance in NLP", EMNLP-CoNLL, sec. 2 (the engine computes it).
         */}
        {bs ? (
          <p className="text-sm text-ink-700" data-testid="bootstrap">
            {Math.round(bs.confidence * 100)} % interval {signed(bs.ci[0])} to {signed(bs.ci[1])}, p {bs.pValue < 0.001 ? "< 0.001" : `= ${bs.pValue.toFixed(3)}`} ({bs.samples.toLocaleString()} resamples of
            the test documents).{" "}
            <span className="text-ink-500">
              {bs.ci[0] > 0
                ? "B is better on these documents beyond what chance would give."
                : bs.ci[1] < 0
                  ? "A is better on these documents beyond what chance would give."
                  : "The interval includes 0: on these documents the difference may be chance."}
            </span>
          </p>
        ) : (
          <Notice tone="warn">A confidence interval needs at least two test documents.</Notice>
        )}
      </Card>
      <Card>
        <h3 className="mb-2 font-semibold text-ink-900">Per entity type</h3>
        <DataTable table={table} flexRender={flexRender} caption="Per-type scores of A and B" />
      </Card>
      <Card>
        <h3 className="mb-2 font-semibold text-ink-900">Where they disagree most</h3>
        {c.disagreements.length === 0 ? (
          <p className="text-sm text-ink-500">The two taggers tag every test token alike.</p>
        ) : (
          <ul className="divide-y divide-ink-50" aria-label="Documents where the taggers disagree">
            {c.disagreements.map((d) => (
              <li key={d.documentId} className="flex flex-wrap items-center justify-between gap-2 py-2 text-sm">
                <Link className="font-medium text-ink-900 hover:underline" to={paths.org.compareDocument.build(orgId, corpusId, c.a.id, c.b.id, d.documentId)}>
                  <UserText>{d.title}</UserText>
                </Link>
                <span className="text-xs text-ink-500 tabular-nums">
                  {d.tokensDiffering} of {d.tokens} tokens tagged differently · F1 A {score(d.f1A)} · B {score(d.f1B)}
                </span>
              </li>
            ))}
          </ul>
        )}
      </Card>
    </div>
  );
}
