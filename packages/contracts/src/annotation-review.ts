import type { Span } from "./spans";
import { sortSpans, spanKey } from "./span-rules";

/** One annotator's spans of a document, under a key of the caller's choosing (e.g. an assignment id). */
export type AnnotatorSpans = { key: string; spans: readonly Span[] };

/**
 * A stretch of text where the annotators did not all mark the same spans: every span that any of
 * them marked there (spans chained by overlap), and for each annotator the spans they marked in it
 * (none at all is a version too).
 */
export type Disagreement = { id: string; start: number; end: number; versions: Array<{ key: string; spans: Span[] }> };

export type Comparison = { agreed: Span[]; disagreements: Disagreement[] };

/**
 * Splits the annotators' spans of one document into those every annotator marked identically
 * (same start, end and type) and the disagreements, in text order. Each annotator's spans are
 * flat, so an agreed span never overlaps a disagreement.
 */
export function compareAnnotations(annotators: readonly AnnotatorSpans[]): Comparison {
  const owners = new Map<string, Set<string>>();
  const byKey = new Map<string, Span>();
  for (const a of annotators) {
    for (const s of a.spans) {
      const k = spanKey(s);
      byKey.set(k, { start: s.start, end: s.end, type: s.type });
      const set = owners.get(k) ?? new Set<string>();
      set.add(a.key);
      owners.set(k, set);
    }
  }
  const agreed: Span[] = [];
  const disputed: Array<{ span: Span; owners: Set<string> }> = [];
  for (const [k, span] of byKey) {
    const who = owners.get(k)!;
    if (who.size === annotators.length) agreed.push(span);
    else disputed.push({ span, owners: who });
  }
  disputed.sort((x, y) => x.span.start - y.span.start || x.span.end - y.span.end);
  const disagreements: Disagreement[] = [];
  let group: typeof disputed = [];
  let groupEnd = -1;
  const close = () => {
    if (!group.length) return;
    const start = group[0]!.span.start;
    const versions = annotators.map((a) => ({
      key: a.key,
      spans: sortSpans(group.filter((g) => g.owners.has(a.key)).map((g) => g.span)),
    }));
    disagreements.push({ id: `${start}-${groupEnd}`, start, end: groupEnd, versions });
    group = [];
  };
  for (const d of disputed) {
    if (group.length && d.span.start >= groupEnd) close();
    if (!group.length) groupEnd = d.span.end;
    group.push(d);
    groupEnd = Math.max(groupEnd, d.span.end);
  }
  close();
  return { agreed: sortSpans(agreed), disagreements };
}

/**
 * The settled spans of a document: the agreed spans plus, for every disagreement, the spans the
 * reviewer chose for it (a missing choice keeps nothing there).
 */
export function settleComparison(comparison: Comparison, choices: ReadonlyMap<string, readonly Span[]>): Span[] {
  const out: Span[] = [...comparison.agreed];
  for (const d of comparison.disagreements) out.push(...(choices.get(d.id) ?? []));
  return sortSpans(out);
}
