import { type Disagreement, type ReviewDocumentView, type Span, assignmentStateStates, compareAnnotations, countOf, findOverlap, settleComparison, spanKey } from "@tagloom/contracts";
import { useMemo, useState } from "react";
import { Link } from "react-router";
import { Button } from "@/components/ui/button";
import { Card, Notice } from "@/components/ui/card";
import { StateBadge } from "@/components/ui/state-badge";
import { useAcceptAssignment } from "../api/accept-assignment";
import { useSettleDocument } from "../api/settle-document";
import { ReturnForm } from "./return-form";
import { type Choice, DisagreementItem } from "./disagreement-item";
import { SpanContext } from "./span-context";
import { wordEdges } from "./word-edges";
import { UserText } from "@/components/ui/user-text";

type Props = { orgId: string; view: ReviewDocumentView; openLink: (assignmentId: string) => string; onDone: (what: string) => void };

/**
 * Review of one document of a batch. One annotator: accept their work as gold, or send it back
 * with a comment. Several: their disagreements span by span, each settled by choosing a version
 * or editing, then the settled result is accepted as gold.
 */
export function ReviewPanel({ orgId, view, openLink, onDone }: Props) {
  const finished = useMemo(() => view.assignments.filter((a) => a.state === "submitted"), [view.assignments]);
  const names = new Map(view.assignments.map((a) => [a.id, a.annotator.name]));
  const comparison = useMemo(() => compareAnnotations(finished.map((a) => ({ key: a.id, spans: a.spans }))), [finished]);
  // Nothing is chosen for the reviewer: every disagreement waits for a decision.
  const [choices, setChoices] = useState<Map<string, Choice>>(() => new Map());
  const edges = useMemo(() => wordEdges(view.document.text, view.document.tokens), [view.document]);
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
  const unsettled = comparison.disagreements.filter((d) => !choices.has(d.id)).length;
  const single = view.assignments.length === 1;

  const doSettle = async () => {
    setError(null);
    try {
      if (single) await accept.mutateAsync(finished[0]!.id);
      else await settle.mutateAsync(settled);
      onDone(`Accepted as gold: ${countOf(settled.length, "span")}.`);
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
              <UserText className="font-medium text-ink-800">{a.annotator.name}</UserText>
              <StateBadge state={assignmentStateStates[a.state]} />
              {a.state === "submitted" ? <span className="text-ink-500">{countOf(a.spans.length, "span")}</span> : null}
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
          <h2 className="font-semibold text-ink-900">Spans of <UserText>{finished[0]!.annotator.name}</UserText></h2>
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
            <p className="text-sm text-ink-500">{countOf(comparison.agreed.length, "span")} marked identically by everyone {comparison.agreed.length === 1 ? "is" : "are"} kept as {comparison.agreed.length === 1 ? "it is" : "they are"}.</p>
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
                edges={edges}
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
            <Button busy={settle.isPending || accept.isPending} disabled={!!overlap || (!single && unsettled > 0)} aria-describedby="accept-hint" onClick={() => void doSettle()}>
              {single ? "Accept as gold" : `Accept the settled result as gold (${countOf(settled.length, "span")})`}
            </Button>
            <span id="accept-hint" className="text-sm text-ink-500">
              {!single && unsettled > 0 ? `Settle ${unsettled === 1 ? "1 more disagreement" : `${unsettled} more disagreements`} first. ` : null}
              Gold replaces any earlier gold of this document.
            </span>
          </div>
        </div>
      ) : null}
    </div>
  );
}
