/**
 * Position buckets for position-aware transitions: the transition into token t of sentence s
 * (s counted within its document) uses the matrix of bucket
 *   tokenBucket(t) × sentenceBucketCount + sentenceBucket(s),
 * where tokenBucket(t) is the number of token boundaries ≤ t and sentenceBucket(s) the number of
 * sentence boundaries ≤ s. Empty boundary lists give one bucket: the position-free model.
 * Example: token boundaries [2, 4] → tokens 1 | 2-3 | 4+ (token 0 uses the start distribution).
 */
export type PositionBuckets = { readonly token: readonly number[]; readonly sentence: readonly number[] };

/** The position-free special case. */
export const NO_POSITION_BUCKETS: PositionBuckets = { token: [], sentence: [] };

/** Throws RangeError unless both lists are strictly increasing positive integers. */
export function checkPositionBuckets(buckets: PositionBuckets): void {
  for (const [name, list] of [
    ["token", buckets.token],
    ["sentence", buckets.sentence],
  ] as const) {
    list.forEach((b, i) => {
      if (!Number.isInteger(b) || b < 1) throw new RangeError(`${name} position boundary ${b} must be a positive integer`);
      if (i > 0 && b <= list[i - 1]) throw new RangeError(`${name} position boundaries must increase: ${list.join(",")}`);
    });
  }
}

/** Number of transition matrices the buckets define. */
export function bucketCount(buckets: PositionBuckets): number {
  return (buckets.token.length + 1) * (buckets.sentence.length + 1);
}

/** Number of start distributions (one per sentence bucket). */
export function sentenceBucketCount(buckets: PositionBuckets): number {
  return buckets.sentence.length + 1;
}

function countAtMost(boundaries: readonly number[], value: number): number {
  let n = 0;
  while (n < boundaries.length && boundaries[n] <= value) n++;
  return n;
}

/** Sentence bucket of the sentence with index `sentenceIndex` in its document. */
export function sentenceBucketOf(buckets: PositionBuckets, sentenceIndex: number): number {
  return countAtMost(buckets.sentence, sentenceIndex);
}

/**
 * Fills `out[t]` (t = 1..length-1) with the bucket of the transition into token t for a sentence
 * at `sentenceIndex`; out[0] is 0 and unused.
 */
export function fillTransitionBuckets(buckets: PositionBuckets, length: number, sentenceIndex: number, out: Int32Array): Int32Array {
  if (out.length < length) throw new RangeError(`fillTransitionBuckets: out has length ${out.length}, expected ${length}`);
  const sentenceBuckets = buckets.sentence.length + 1;
  const sb = sentenceBucketOf(buckets, sentenceIndex);
  let tb = 0;
  if (length > 0) out[0] = 0;
  for (let t = 1; t < length; t++) {
    while (tb < buckets.token.length && buckets.token[tb] <= t) tb++;
    out[t] = tb * sentenceBuckets + sb;
  }
  return out;
}

/**
 * Parses the CLI form: `none`, a comma list of token boundaries (`1,2,4`), or
 * `token:1,2,4/sentence:1` (either part optional).
 */
export function parsePositionBuckets(text: string): PositionBuckets {
  const trimmed = text.trim();
  if (trimmed === "none" || trimmed === "") return NO_POSITION_BUCKETS;
  const numbers = (list: string): number[] =>
    list.split(",").map((x) => {
      const n = Number(x.trim());
      if (x.trim() === "" || !Number.isInteger(n)) throw new RangeError(`position bucket boundary "${x}" is not an integer`);
      return n;
    });
  let token: number[] = [];
  let sentence: number[] = [];
  if (!trimmed.includes(":")) {
    token = numbers(trimmed);
  } else {
    for (const part of trimmed.split("/")) {
      const [kind, list] = part.split(":", 2);
      if (kind === "token") token = numbers(list ?? "");
      else if (kind === "sentence") sentence = numbers(list ?? "");
      else throw new RangeError(`position buckets: unknown part "${kind}" (expected token: or sentence:)`);
    }
  }
  const buckets = { token, sentence };
  checkPositionBuckets(buckets);
  return buckets;
}

/** The CLI form of buckets (inverse of parsePositionBuckets). */
export function formatPositionBuckets(buckets: PositionBuckets): string {
  if (buckets.token.length === 0 && buckets.sentence.length === 0) return "none";
  const parts: string[] = [];
  if (buckets.token.length > 0) parts.push(`token:${buckets.token.join(",")}`);
  if (buckets.sentence.length > 0) parts.push(`sentence:${buckets.sentence.join(",")}`);
  return parts.join("/");
}
