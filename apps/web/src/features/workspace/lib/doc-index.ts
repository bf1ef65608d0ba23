import type { DocumentTokens } from "@tagloom/contracts";

/**
 * Rows the document is drawn in: a paragraph (text between blank lines, or a line of its own)
 * or, for a long paragraph, runs of whole sentences of at most MAX_ROW_TOKENS tokens. Only the
 * rows on screen are rendered, so a 50,000-token document costs as much as a short one.
 */
export type Block = { firstToken: number; endToken: number; start: number; end: number };

export type DocIndex = {
  text: string;
  starts: Int32Array;
  ends: Int32Array;
  tokenCount: number;
  blocks: Block[];
  /** The block each token is drawn in. */
  blockOfToken: Int32Array;
};

const MAX_ROW_TOKENS = 300;

/** Index of the first element ≥ value in an ascending array. */
export function lowerBound(values: ArrayLike<number>, value: number): number {
  let lo = 0;
  let hi = values.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (values[mid]! < value) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

export function buildDocIndex(text: string, tokens: DocumentTokens): DocIndex {
  const n = tokens.starts.length;
  const starts = Int32Array.from(tokens.starts);
  const ends = Int32Array.from(tokens.ends);
  const sentenceStart = new Uint8Array(n);
  for (const s of tokens.sentenceStarts) if (s < n) sentenceStart[s] = 1;
  const blocks: Block[] = [];
  const blockOfToken = new Int32Array(n);
  let first = 0;
  const close = (end: number) => {
    if (end <= first) return;
    blocks.push({ firstToken: first, endToken: end, start: starts[first]!, end: ends[end - 1]! });
    for (let t = first; t < end; t++) blockOfToken[t] = blocks.length - 1;
    first = end;
  };
  let lastSentenceStart = 0;
  for (let t = 1; t < n; t++) {
    if (sentenceStart[t]) lastSentenceStart = t;
    const gap = text.slice(ends[t - 1]!, starts[t]!);
    // A line break between sentences ends a row; so does a long run (cut at a sentence start when there is one).
    if (gap.includes("\n") && (sentenceStart[t] || /\n\s*\n/.test(gap))) close(t);
    else if (t - first >= MAX_ROW_TOKENS) close(lastSentenceStart > first ? lastSentenceStart : t);
  }
  close(n);
  return { text, starts, ends, tokenCount: n, blocks, blockOfToken };
}

/** The token at or after a character offset (for spans, whose starts are token starts). */
export function tokenAtOrAfter(doc: DocIndex, offset: number): number {
  return lowerBound(doc.starts, offset);
}

/** The token range [from, to) a character span covers. */
export function tokenRange(doc: DocIndex, span: { start: number; end: number }): [number, number] {
  const from = lowerBound(doc.ends, span.start + 1);
  const to = lowerBound(doc.starts, span.end);
  return [from, Math.max(from + 1, to)];
}
