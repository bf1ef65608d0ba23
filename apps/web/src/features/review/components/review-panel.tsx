import { type Disagreement, type ReviewDocumentView, type Span, assignmentStateLabels, compareAnnotations, findOverlap, settleComparison, spanKey } from "@tagloom/contracts";
import { useMemo, useState } from "react";
import { Link } from "react-router";
import { Button } from "@/components/ui/button";
import { Card, Notice } from "@/components/ui/card";
import { Select } from "@/components/ui/field";
import { cn } from "@/lib/cn";
import { useAcceptAssignment } from "../api/accept-assignment";
import { useSettleDocument } from "../api/settle-document";
import { ReturnForm } from "./return-form";
import { SpanContext } from "./span-context";

type Props = { orgId: string; view: ReviewDocumentView; openLink: (assignmentId: string) => string; onDone: (what: string) => void };

/** A choice for one disagreement: one annotator's version, or spans picked and typed by hand. */
type Choice = { kind: "version"; key: string } | { kind: "edit"; spans: Span[] };

function majorityKey(d: Disagreement): string {
  const counts = new Map<string, { n: number; key: string }>();
  for (const v of d.versions) {
    const sig = v.spans.map(spanKey).join("|");
    const c = counts.get(sig) ?? { n: 0, key: v.key };
    c.n++;
    counts.set(sig, c);
  }
  return [...counts.values()].sort((a, b) => b.n - a.n)[0]!.key;
}

/**
 * Review of one document of a batch. One annotator: accept their work as gold, or send it back
 * with a comment. Several: their disagreements span by span, each settled by choosing a version
 * or editing, then the settled result is accepted as gold.
 */
export function ReviewPanel({ orgId, view, openLink, onDone }: Props) {
  const finished = useMemo(() => view.assignments.filter((a) => a.state === "submitted"), [view.assignments]);
  const names = new Map(view.assignments.map((a) => [a.id, a.annotator.name]));
  const comparison = useMemo(() => compareAnnotations(finished.map((a) => ({ key: a.id, spans: a.spans }))), [finished]);
  const [choices, setChoices] = useState<Map<string, Choice>>(() => new Map(comparison.disagreements.map((d) => [d.id, { kind: "version", key: majorityKey(d) }])));
  const [returning, setReturning] = useState<string | null>(null);
  const settle = useSettleDocument(orgId, view.corpusId, view.batch.id, view.document.id);
  const accept = useAcceptAssignment(orgId, view.corpusId);
  const [error, setError] = useState<string | null>(null);
  const text = view.document.text;

  const chosenSpans = (d: Disagreement): Span[] => {
    const c = choices.get(d.id);
    if (!c) return [];
    if (c.kind === "edit") return c.spans;
    return d.versions.find((v) => v.key === c.key)?.spans ?? [];
  };
  const settled = settleComparison(comparison, new Map(comparison.disagreements.map((d) => [d.id, chosenSpans(d)])));
  const overlap = findOverlap(settled);
  const single = view.assignments.length === 1;

  const doSettle = async () => {
    setError(null);
    try {
      if (single) await accept.mutateAsync(finished[0]!.id);
      else await settle.mutateAsync(settled);
      onDone(`Accepted as gold: ${settled.length} span${settled.length === 1 ? "" : "s"}.`);
    } catch (err) {
      setError(err instanceof Error ? err.message : "Could not accept.");
    }
  };

  return (
    <div className="space-y-6">
      <Card>
        <h2 className="font-semibold text-ink-900">Annotators</h2>
        <ul className="mt-3 divide-y divide-ink-50">
          {view.assignments.map((a) => (
            <li key={a.id} className="flex flex-wrap items-center gap-3 py-2 text-sm">
              <span className="font-medium text-ink-800">{a.annotator.name}</span>
              <span className="text-ink-500">{assignmentStateLabels[a.state]}</span>
              {a.state === "submitted" ? <span className="text-ink-500">{a.spans.length} spans</span> : null}
              <Link to={openLink(a.id)} className="text-ink-700 underline">
                Open read-only
              </Link>
              {a.state === "submitted" ? (
                <Button size="sm" variant="ghost" onClick={() => setReturning(returning === a.id ? null : a.id)}>
                  Send back…
                </Button>
              ) : null}
              {a.reviewComment && a.state === "returned" ? <span className="text-xs text-ink-500">Sent back: “{a.reviewComment}”</span> : null}
              {returning === a.id ? (
                <div className="w-full">
                  <ReturnForm
                    orgId={orgId}
                    corpusId={view.corpusId}
                    assignmentId={a.id}
                    annotatorName={a.annotator.name}
                    onDone={() => {
                      setReturning(null);
                      onDone(`Sent back to ${a.annotator.name}.`);
                    }}
                  />
                </div>
              ) : null}
            </li>
          ))}
        </ul>
      </Card>

      {!view.ready ? (
        <Notice tone="info">
          {finished.length} of {view.assignments.length} annotators have submitted. You can settle once everyone has; meanwhile you can send submitted work back.
        </Notice>
      ) : null}

      {view.ready && single ? (
        <Card className="space-y-3">
          <h2 className="font-semibold text-ink-900">Spans of {finished[0]!.annotator.name}</h2>
          {finished[0]!.spans.length ? (
            <ul className="space-y-2 text-sm">
              {finished[0]!.spans.map((s) => (
                <li key={spanKey(s)}>
                  <SpanContext text={text} start={s.start} end={s.end} spans={[s]} types={view.entityTypes} pad={40} />
                </li>
              ))}
            </ul>
          ) : (
            <p className="text-sm text-ink-500">No spans marked.</p>
          )}
        </Card>
      ) : null}

      {view.ready && !single ? (
        <Card className="space-y-4">
          <div className="flex flex-wrap items-baseline justify-between gap-2">
            <h2 className="font-semibold text-ink-900">Disagreements ({comparison.disagreements.length})</h2>
            <p className="text-sm text-ink-500">{comparison.agreed.length} spans marked identically by everyone are kept as they are.</p>
          </div>
          {comparison.disagreements.length === 0 ? <p className="text-sm text-moss-500">The annotators agree on every span.</p> : null}
          <ol className="space-y-4">
            {comparison.disagreements.map((d, i) => (
              <DisagreementItem
                key={d.id}
                index={i}
                d={d}
                text={text}
                types={view.entityTypes}
                names={names}
                typeNames={view.entityTypes.map((t) => t.name)}
                choice={choices.get(d.id)}
                onChoice={(c) => setChoices((old) => new Map(old).set(d.id, c))}
              />
            ))}
          </ol>
        </Card>
      ) : null}

      {view.ready ? (
        <div className="space-y-2">
          {overlap ? (
            <Notice tone="error">
              The settled spans overlap: {overlap[0].type} "{text.slice(overlap[0].start, overlap[0].end)}" and {overlap[1].type} "{text.slice(overlap[1].start, overlap[1].end)}". Choose one of them.
            </Notice>
          ) : null}
          {error ? <Notice tone="error">{error}</Notice> : null}
          <div className="flex items-center gap-3">
            <Button busy={settle.isPending || accept.isPending} disabled={!!overlap} onClick={() => void doSettle()}>
              {single ? "Accept as gold" : `Accept the settled result as gold (${settled.length} spans)`}
            </Button>
            <span className="text-sm text-ink-500">Gold replaces any earlier gold of this document.</span>
          </div>
        </div>
      ) : null}
    </div>
  );
}

function DisagreementItem({
  index,
  d,
  text,
  types,
  names,
  typeNames,
  choice,
  onChoice,
}: {
  index: number;
  d: Disagreement;
  text: string;
  types: ReviewDocumentView["entityTypes"];
  names: ReadonlyMap<string, string>;
  typeNames: string[];
  choice: Choice | undefined;
  onChoice: (c: Choice) => void;
}) {
  const candidates = useMemo(() => {
    const all = new Map<string, Span>();
    for (const v of d.versions) for (const s of v.spans) all.set(spanKey(s), s);
    return [...all.values()].sort((a, b) => a.start - b.start || a.end - b.end);
  }, [d]);
  const editSpans = choice?.kind === "edit" ? choice.spans : [];
  const group = `choice-${d.id}`;
  return (
    <li className="rounded-md border border-ink-100 p-3">
      <p className="text-xs font-semibold text-ink-500">
        {index + 1}. Characters {d.start}–{d.end}
      </p>
      <p className="mt-1 text-sm">
        <SpanContext text={text} start={d.start} end={d.end} spans={[]} types={types} />
      </p>
      <fieldset className="mt-2 space-y-1">
        <legend className="sr-only">Settle disagreement {index + 1}</legend>
        {d.versions.map((v) => (
          <label key={v.key} className={cn("flex items-start gap-2 rounded-md px-2 py-1 text-sm", choice?.kind === "version" && choice.key === v.key && "bg-ink-50")}>
            <input type="radio" name={group} checked={choice?.kind === "version" && choice.key === v.key} onChange={() => onChoice({ kind: "version", key: v.key })} className="mt-1" />
            <span>
              <span className="font-medium">{names.get(v.key) ?? "Annotator"}:</span>{" "}
              {v.spans.length ? (
                v.spans.map((s) => (
                  <span key={spanKey(s)} className="mr-2">
                    <SpanContext text={text} start={s.start} end={s.end} spans={[s]} types={types} pad={0} />
                  </span>
                ))
              ) : (
                <span className="text-ink-500">no span here</span>
              )}
            </span>
          </label>
        ))}
        <label className={cn("flex items-start gap-2 rounded-md px-2 py-1 text-sm", choice?.kind === "edit" && "bg-ink-50")}>
          <input
            type="radio"
            name={group}
            checked={choice?.kind === "edit"}
            onChange={() => onChoice({ kind: "edit", spans: choice?.kind === "version" ? (d.versions.find((v) => v.key === choice.key)?.spans ?? []) : [] })}
            className="mt-1"
          />
          <span className="font-medium">Edit: pick spans and their types</span>
        </label>
        {choice?.kind === "edit" ? (
          <ul className="ml-8 space-y-1">
            {candidates.map((c) => {
              const picked = editSpans.find((s) => s.start === c.start && s.end === c.end);
              return (
                <li key={spanKey(c)} className="flex items-center gap-2 text-sm">
                  <input
                    type="checkbox"
                    aria-label={`Keep "${text.slice(c.start, c.end)}"`}
                    checked={!!picked}
                    onChange={(e) =>
                      onChoice({
                        kind: "edit",
                        spans: e.target.checked ? [...editSpans, c] : editSpans.filter((s) => !(s.start === c.start && s.end === c.end)),
                      })
                    }
                  />
                  <span className="font-serif">"{text.slice(c.start, c.end)}"</span>
                  <Select
                    aria-label={`Type of "${text.slice(c.start, c.end)}"`}
                    className="w-36 py-1"
                    value={picked?.type ?? c.type}
                    disabled={!picked}
                    onChange={(e) => onChoice({ kind: "edit", spans: editSpans.map((s) => (s.start === c.start && s.end === c.end ? { ...s, type: e.target.value } : s)) })}
                  >
                    {typeNames.map((t) => (
                      <option key={t} value={t}>
                        {t}
                      </option>
                    ))}
                  </Select>
                </li>
              );
            })}
          </ul>
        ) : null}
      </fieldset>
    </li>
  );
}
