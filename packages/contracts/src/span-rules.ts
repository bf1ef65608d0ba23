/** The part of a span the rules below look at. */
type Range = { start: number; end: number; type: string };

/** Sorts spans by start, then end (a copy). */
export function sortSpans<T extends Range>(spans: readonly T[]): T[] {
  return [...spans].sort((a, b) => a.start - b.start || a.end - b.end || (a.type < b.type ? -1 : a.type > b.type ? 1 : 0));
}

/** The first pair of spans that share a character, in text order, or null when the spans are flat. */
export function findOverlap<T extends Range>(spans: readonly T[]): [T, T] | null {
  const sorted = sortSpans(spans);
  for (let i = 1; i < sorted.length; i++) {
    if (sorted[i]!.start < sorted[i - 1]!.end) return [sorted[i - 1]!, sorted[i]!];
  }
  return null;
}

/** Index of the first token whose start is ≥ offset (starts ascending). */
export function lowerBound(values: readonly number[], offset: number): number {
  let lo = 0;
  let hi = values.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (values[mid]! < offset) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

export type SpanProblem = { index: number; message: string };

/**
 * Why a list of spans cannot be stored for a text with these tokens, or null when it can: every
 * span must lie inside the text, begin where a token begins and end where a token ends, use a
 * known type, and no two spans may share a character (spans are flat).
 */
export function checkSpans(
  spans: readonly Range[],
  tokens: { starts: readonly number[]; ends: readonly number[] },
  textLength: number,
  typeNames: ReadonlySet<string>,
): SpanProblem | null {
  for (let i = 0; i < spans.length; i++) {
    const s = spans[i]!;
    const where = `Span ${i + 1} [${s.start}, ${s.end})`;
    if (s.end > textLength) return { index: i, message: `${where} reaches past the end of the text (${textLength} characters).` };
    if (!typeNames.has(s.type)) return { index: i, message: `${where} has the type "${s.type}", which this corpus does not have.` };
    const first = lowerBound(tokens.starts, s.start);
    if (tokens.starts[first] !== s.start) return { index: i, message: `${where} does not begin where a token begins.` };
    const last = lowerBound(tokens.ends, s.end);
    if (tokens.ends[last] !== s.end) return { index: i, message: `${where} does not end where a token ends.` };
  }
  const overlap = findOverlap(spans);
  if (overlap) {
    const [a, b] = overlap;
    return {
      index: spans.indexOf(b),
      message: `Spans overlap: ${a.type} [${a.start}, ${a.end}) and ${b.type} [${b.start}, ${b.end}) share characters. Spans are flat: remove or shorten one.`,
    };
  }
  return null;
}

/** A key that is equal for spans with the same offsets and type. */
export function spanKey(span: Range): string {
  return `${span.start}:${span.end}:${span.type}`;
}
