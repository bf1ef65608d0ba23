import { type SuggesterStatus, countOf } from "@tagloom/contracts";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Card, Notice } from "@/components/ui/card";
import { Field, Select } from "@/components/ui/field";
import { formatCount } from "@/lib/format";
import { useSetSuggester } from "../api/set-suggester";

const NONE = "";
const pct = (x: number) => `${Math.round(x * 100)}%`;

/** Which tagger suggests for the corpus, the progress of its runs, and (for data leads) the picker. */
export function SuggesterPanel({ orgId, corpusId, status, canChoose }: { orgId: string; corpusId: string; status: SuggesterStatus; canChoose: boolean }) {
  const set = useSetSuggester(orgId, corpusId);
  const [choice, setChoice] = useState<string>(status.tagger?.id ?? NONE);
  const latest = status.runs[0];
  const { accepted, rejected, precision } = status.judgement;
  return (
    <Card className="space-y-4" aria-labelledby="suggester-heading">
      <div>
        <h2 id="suggester-heading" className="font-semibold text-ink-900">
          Suggester
        </h2>
        <p className="mt-1 text-sm text-ink-700" data-testid="suggester-current">
          {status.tagger ? (
            <>
              <span className="font-medium">{status.tagger.name}</span> (version {status.tagger.version}) pre-annotates documents without gold. Annotators see its spans as
              suggestions with a confidence, never as gold.
            </>
          ) : (
            "No tagger suggests for this corpus yet."
          )}
        </p>
      </div>
      {latest ? (
        <div className="space-y-1" data-testid="suggester-progress">
          <p className="text-sm text-ink-700">
            {latest.finishedAt ? "Tagged" : "Tagging"} {formatCount(latest.documentsDone)} of {formatCount(latest.documentsTotal)} documents
            {latest.reason === "new_documents" ? " (newly uploaded)" : ""} · {countOf(latest.spansSuggested, "span")} suggested · shard {latest.shardsDone} of{" "}
            {latest.shardsTotal}
          </p>
          <div className="h-2 overflow-hidden rounded-full bg-ink-50" role="progressbar" aria-valuemin={0} aria-valuemax={latest.documentsTotal || 1} aria-valuenow={latest.documentsDone} aria-label="Suggestion progress">
            <div className="h-full bg-thread-500 transition-all" style={{ width: `${latest.documentsTotal ? (100 * latest.documentsDone) / latest.documentsTotal : 100}%` }} />
          </div>
        </div>
      ) : null}
      {status.tagger ? (
        <p className="text-sm text-ink-700" data-testid="suggester-precision">
          As annotators judged it: {formatCount(accepted)} accepted, {formatCount(rejected)} rejected
          {precision === null ? " — no decisions yet." : ` — precision ${pct(precision)}.`}
        </p>
      ) : null}
      {canChoose ? (
        <form
          className="flex flex-wrap items-end gap-3"
          onSubmit={(e) => {
            e.preventDefault();
            set.mutate({ taggerId: choice === NONE ? null : choice });
          }}
        >
          <div className="min-w-64">
            <Field label="Tagger that suggests" hint={status.candidates.length === 0 ? "Train a tagger on this corpus first." : "Changing it replaces suggestions nobody has decided on yet."}>
              {(id, describedBy) => (
                <Select id={id} aria-describedby={describedBy} value={choice} onChange={(e) => setChoice(e.target.value)}>
                  <option value={NONE}>None</option>
                  {status.candidates.map((t) => (
                    <option key={t.id} value={t.id}>
                      {t.name} · v{t.version}
                      {t.f1 === null ? "" : ` · test F1 ${t.f1.toFixed(3)}`}
                    </option>
                  ))}
                </Select>
              )}
            </Field>
          </div>
          <Button type="submit" busy={set.isPending} disabled={choice === (status.tagger?.id ?? NONE)} className="mb-5">
            Use this suggester
          </Button>
        </form>
      ) : null}
      {set.isError ? <Notice tone="error">{set.error.message}</Notice> : null}
    </Card>
  );
}
