import type { Evaluation, Tagger, TrainingRun } from "@tagloom/contracts";
import { createColumnHelper, flexRender } from "@tanstack/react-table";
import { useDataTable } from "@/components/ui/use-data-table";
import { useState } from "react";
import { Link, useNavigate } from "react-router";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { DataTable } from "@/components/ui/data-table";
import { Select } from "@/components/ui/field";
import { paths } from "@/config/paths";
import { formatCount } from "@/lib/format";
import { taggerDownloadUrl } from "../api/get-tagger";
import { ConfigList } from "./config-list";
import { ConfusionGrid } from "./confusion-grid";
import { IterationsView } from "./iterations-table";
import { LineFigure } from "./line-chart";
import { score } from "./run-status";

type TypeRow = Evaluation["types"][number];
const tcol = createColumnHelper<TypeRow>();
const typeColumns = [
  tcol.accessor("type", { header: "Type", cell: (c) => <span className="font-mono text-xs">{c.getValue()}</span> }),
  tcol.accessor("precision", { header: "Precision", cell: (c) => <span className="tabular-nums">{score(c.getValue())}</span> }),
  tcol.accessor("recall", { header: "Recall", cell: (c) => <span className="tabular-nums">{score(c.getValue())}</span> }),
  tcol.accessor("f1", { header: "F1", cell: (c) => <span className="font-medium tabular-nums">{score(c.getValue())}</span> }),
  tcol.accessor("support", { header: "Support", cell: (c) => <span className="tabular-nums">{formatCount(c.getValue())}</span> }),
  tcol.accessor("predicted", { header: "Predicted", cell: (c) => <span className="tabular-nums">{formatCount(c.getValue())}</span> }),
  tcol.accessor("correct", { header: "Correct", cell: (c) => <span className="tabular-nums">{formatCount(c.getValue())}</span> }),
];

type CurveRow = Evaluation["learningCurve"][number];
const ccol = createColumnHelper<CurveRow>();
const curveColumns = [
  ccol.accessor("fraction", { header: "Gold used", cell: (c) => `${Math.round(c.getValue() * 100)} %` }),
  ccol.accessor("documents", { header: "Documents" }),
  ccol.accessor("tokens", { header: "Tokens", cell: (c) => formatCount(c.getValue()) }),
  ccol.accessor("f1", { header: "Test F1", cell: (c) => <span className="tabular-nums">{score(c.getValue())}</span> }),
  ccol.accessor("tokenAccuracy", { header: "Token accuracy", cell: (c) => <span className="tabular-nums">{score(c.getValue())}</span> }),
];

function Figure({ label, value, note }: { label: string; value: string; note?: string }) {
  return (
    <div className="rounded-lg border border-ink-100 bg-white px-4 py-3">
      <div className="text-xs text-ink-500">{label}</div>
      <div className="text-2xl font-semibold text-ink-900 tabular-nums">{value}</div>
      {note ? <div className="text-xs text-ink-500">{note}</div> : null}
    </div>
  );
}

/**
 * A tagger's evaluation on its run's test split, in the CoNLL convention (an entity counts only
 * when its type and both boundaries match: Tjong Kim Sang & De Meulder 2003, "Introduction to
 * the CoNLL-2003 Shared Task", evaluation section; from memory), with cross-validation beside it, the learning curve and
 * the confusion between types.
 */
export function TaggerView({
  orgId,
  corpusId,
  tagger,
  run,
  others,
  canDownload,
}: {
  orgId: string;
  corpusId: string;
  tagger: Tagger;
  run: TrainingRun | null;
  others: Tagger[];
  canDownload: boolean;
}) {
  const e = tagger.evaluation;
  const navigate = useNavigate();
  const [other, setOther] = useState(others[0]?.id ?? "");
  const types = useDataTable({ data: e.types, columns: typeColumns });
  const curve = useDataTable({ data: e.learningCurve, columns: curveColumns });
  const cv = e.crossValidation;
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <div>
          <h2 className="text-lg font-semibold text-ink-900">{tagger.label}</h2>
          <p className="text-sm text-ink-500">
            Tested on {e.documents} documents ({formatCount(e.tokens)} tokens, {formatCount(e.sentences)} sentences)
            {run ? (
              <>
                {" "}
                · made by{" "}
                <Link className="underline" to={paths.org.run.build(orgId, corpusId, run.id)}>
                  run {run.number}
                </Link>
              </>
            ) : null}
          </p>
        </div>
        <div className="flex flex-wrap items-center gap-2">
          {canDownload ? (
            <>
              <a className="rounded-md border border-ink-200 bg-white px-3 py-1.5 text-sm text-ink-800 hover:bg-ink-50" href={taggerDownloadUrl(orgId, corpusId, tagger.id, "download")} download>
                Download tagger (JSON)
              </a>
              <a className="rounded-md border border-ink-200 bg-white px-3 py-1.5 text-sm text-ink-800 hover:bg-ink-50" href={taggerDownloadUrl(orgId, corpusId, tagger.id, "evaluation")} download>
                Download evaluation (JSON)
              </a>
            </>
          ) : null}
        </div>
      </div>

      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-5">
        <Figure label="Entity F1 (test)" value={score(e.overall.f1)} note={cv ? `cross-validated ${score(cv.f1.mean)} ± ${score(cv.f1.std)}` : "no cross-validation"} />
        <Figure label="Precision" value={score(e.overall.precision)} note={cv ? `CV ${score(cv.precision.mean)} ± ${score(cv.precision.std)}` : `${e.overall.correct} of ${e.overall.predicted} predicted`} />
        <Figure label="Recall" value={score(e.overall.recall)} note={cv ? `CV ${score(cv.recall.mean)} ± ${score(cv.recall.std)}` : `${e.overall.correct} of ${e.overall.gold} in gold`} />
        <Figure label="Token accuracy" value={score(e.tokenAccuracy)} note={cv ? `CV ${score(cv.tokenAccuracy.mean)} ± ${score(cv.tokenAccuracy.std)}` : undefined} />
        <Figure label="Entities" value={`${formatCount(e.overall.correct)} / ${formatCount(e.overall.gold)}`} note="correct / in gold" />
      </div>
      {cv ? (
        <p className="text-xs text-ink-500">
          Cross-validation: {cv.folds} folds over the training {cv.unit === "documents" ? "documents" : "sentence blocks"}; mean ± standard deviation over folds.
        </p>
      ) : null}

      <Card>
        <h3 className="mb-2 font-semibold text-ink-900">Per entity type</h3>
        <DataTable table={types} flexRender={flexRender} caption="Precision, recall and F1 per entity type" />
      </Card>

      <Card>
        <h3 className="mb-2 font-semibold text-ink-900">Learning curve</h3>
        <p className="mb-2 text-sm text-ink-500">Test F1 when trained on part of the gold documents: a curve still rising at 100 % says more gold would help.</p>
        <div className="grid gap-3 lg:grid-cols-2">
          <LineFigure
            title="Test F1 by share of gold documents"
            data={e.learningCurve.map((p) => ({ share: `${Math.round(p.fraction * 100)} %`, f1: p.f1, acc: p.tokenAccuracy }))}
            x="share"
            xLabel="share of training documents"
            series={[
              { key: "f1", name: "entity F1", color: "#2f6f8f" },
              { key: "acc", name: "token accuracy", color: "#b8661c", dash: "6 4" },
            ]}
            yDomain={[0, 1]}
            yFormat={(v) => v.toFixed(2)}
          />
          <DataTable table={curve} flexRender={flexRender} caption="Learning curve" />
        </div>
      </Card>

      <Card>
        <h3 className="mb-2 font-semibold text-ink-900">Confusion between types</h3>
        <ConfusionGrid confusion={e.confusion} />
      </Card>

      {e.semiSupervised ? (
        <Card>
          <h3 className="mb-2 font-semibold text-ink-900">Passes over documents without gold</h3>
          <IterationsView iterations={e.semiSupervised.iterations} method={e.semiSupervised.method} />
        </Card>
      ) : null}

      {run ? (
        <Card>
          <h3 className="mb-2 font-semibold text-ink-900">Trained with</h3>
          <ConfigList config={run.config} seed={run.seed} testSplit={run.testSplit} />
        </Card>
      ) : null}

      <Card>
        <h3 className="mb-2 font-semibold text-ink-900">Compare</h3>
        {others.length === 0 ? (
          <p className="text-sm text-ink-500">Train another tagger on this corpus to compare the two on the same test documents.</p>
        ) : (
          <form
            className="flex flex-wrap items-center gap-2"
            onSubmit={(ev) => {
              ev.preventDefault();
              if (other) navigate(paths.org.compare.build(orgId, corpusId, tagger.id, other));
            }}
          >
            <label htmlFor="compare-with" className="text-sm text-ink-700">
              Compare with
            </label>
            <Select id="compare-with" className="w-auto" value={other} onChange={(ev) => setOther(ev.target.value)}>
              {others.map((o) => (
                <option key={o.id} value={o.id}>
                  {o.label} (F1 {score(o.evaluation.overall.f1)})
                </option>
              ))}
            </Select>
            <Button type="submit" variant="secondary" size="sm">
              Compare
            </Button>
          </form>
        )}
      </Card>
    </div>
  );
}
