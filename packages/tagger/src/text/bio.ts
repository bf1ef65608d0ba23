import type { Token } from "./tokens";

/** An entity chunk over token indices (end exclusive). */
export type Chunk = { type: string; start: number; end: number };

/** An entity span over character offsets of a text (end exclusive). */
export type CharSpan = { start: number; end: number; type: string };

/** True for `O` and for `B-TYPE` / `I-TYPE` with a non-empty type. */
export function isIobTag(tag: string): boolean {
  if (tag === "O") return true;
  const first = tag.charCodeAt(0);
  return (first === 0x42 || first === 0x49) && tag.charCodeAt(1) === 0x2d && tag.length > 2;
}

function checkTag(tags: readonly string[], i: number): void {
  if (!isIobTag(tags[i])) {
    throw new RangeError(`tag ${JSON.stringify(tags[i])} at index ${i} is not an IOB tag (expected O, B-TYPE or I-TYPE)`);
  }
}

/**
 * Chunks of an IOB tag sequence by the CoNLL conlleval convention: a chunk starts at B-X, at I-X
 * after O, and at any tag whose type differs from the previous tag's; it ends before B, before O,
 * or at a type change. IOB1 and IOB2 therefore read alike and invalid sequences are repaired
 * (a stray I-X opens a chunk). The type is everything after the first "-" ("B-WORK-OF-ART" →
 * "WORK-OF-ART"). Throws RangeError on a tag that is not O, B-X or I-X.
 */
export function tagsToChunks(tags: readonly string[]): Chunk[] {
  const chunks: Chunk[] = [];
  let openType: string | null = null;
  let openStart = 0;
  for (let i = 0; i < tags.length; i++) {
    checkTag(tags, i);
    const tag = tags[i];
    if (tag === "O") {
      if (openType !== null) chunks.push({ type: openType, start: openStart, end: i });
      openType = null;
      continue;
    }
    const type = tag.slice(2);
    if (tag.charCodeAt(0) === 0x42 || openType !== type) {
      if (openType !== null) chunks.push({ type: openType, start: openStart, end: i });
      openType = type;
      openStart = i;
    }
  }
  if (openType !== null) chunks.push({ type: openType, start: openStart, end: tags.length });
  return chunks;
}

/**
 * IOB2 tags (B- on every chunk's first token) for a sequence of `length` tokens. Chunks must lie
 * in [0, length), be non-empty and not overlap (RangeError otherwise); they may come in any order.
 */
export function chunksToTags(length: number, chunks: readonly Chunk[]): string[] {
  const tags = new Array<string>(length).fill("O");
  const owner = new Int32Array(length).fill(-1);
  chunks.forEach((chunk, k) => {
    const { type, start, end } = chunk;
    if (!(Number.isInteger(start) && Number.isInteger(end) && start >= 0 && end <= length && start < end)) {
      throw new RangeError(`chunk ${k} ${type} [${start}, ${end}) does not fit a sequence of ${length} tokens`);
    }
    if (type.length === 0) throw new RangeError(`chunk ${k} [${start}, ${end}) has an empty type`);
    for (let i = start; i < end; i++) {
      if (owner[i] >= 0) {
        const other = chunks[owner[i]];
        throw new RangeError(
          `chunks ${owner[i]} ${other.type} [${other.start}, ${other.end}) and ${k} ${type} [${start}, ${end}) overlap at token ${i}`,
        );
      }
      owner[i] = k;
      tags[i] = (i === start ? "B-" : "I-") + type;
    }
  });
  return tags;
}

/** The same chunks written as IOB2; reads IOB1, IOB2 and repairs invalid sequences. */
export function toIob2(tags: readonly string[]): string[] {
  return chunksToTags(tags.length, tagsToChunks(tags));
}

function describeSpan(span: CharSpan): string {
  return `${span.type} [${span.start}, ${span.end})`;
}

/**
 * IOB2 tags, one per token, for character spans over the text the tokens came from.
 *
 * A token belongs to a span when the two share at least one character, so a span that cuts
 * through a token grows to cover the whole token (annotators drag loosely; a token is the smallest
 * unit the tagger can label). A span that touches no token (empty, or over whitespace only) yields
 * no tags. Spans that overlap in characters, or that come to share a token after growing, throw a
 * RangeError naming both. Tokens must be in order and non-overlapping, as tokenizeText gives them.
 */
export function spansToTags(tokens: readonly Token[], spans: readonly CharSpan[]): string[] {
  const order = spans.map((_, k) => k).sort((a, b) => spans[a].start - spans[b].start || spans[a].end - spans[b].end);
  const chunks: Chunk[] = [];
  const chunkSpan: number[] = [];
  let previous = -1;
  for (const k of order) {
    const span = spans[k];
    if (!(span.start <= span.end)) throw new RangeError(`span ${k} ${describeSpan(span)} ends before it starts`);
    if (span.type.length === 0) throw new RangeError(`span ${k} ${describeSpan(span)} has an empty type`);
    if (span.end === span.start) continue;
    if (previous >= 0 && span.start < spans[previous].end) {
      throw new RangeError(`spans ${describeSpan(spans[previous])} and ${describeSpan(span)} overlap`);
    }
    previous = k;
    const first = firstTokenEndingAfter(tokens, span.start);
    let last = first;
    while (last < tokens.length && tokens[last].start < span.end) last++;
    if (last === first) continue;
    const prior = chunks[chunks.length - 1];
    if (prior !== undefined && first < prior.end) {
      const other = spans[chunkSpan[chunkSpan.length - 1]];
      throw new RangeError(`spans ${describeSpan(other)} and ${describeSpan(span)} both cover token ${first}`);
    }
    chunks.push({ type: span.type, start: first, end: last });
    chunkSpan.push(k);
  }
  return chunksToTags(tokens.length, chunks);
}

function firstTokenEndingAfter(tokens: readonly Token[], offset: number): number {
  let lo = 0;
  let hi = tokens.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (tokens[mid].end > offset) hi = mid;
    else lo = mid + 1;
  }
  return lo;
}

/**
 * Character spans for a tag sequence over tokens: each chunk (conlleval convention, as
 * tagsToChunks) runs from its first token's start to its last token's end. RangeError when the
 * lengths differ.
 */
export function tagsToSpans(tokens: readonly Token[], tags: readonly string[]): CharSpan[] {
  if (tokens.length !== tags.length) {
    throw new RangeError(`${tokens.length} tokens but ${tags.length} tags`);
  }
  return tagsToChunks(tags).map((c) => ({ start: tokens[c.start].start, end: tokens[c.end - 1].end, type: c.type }));
}
