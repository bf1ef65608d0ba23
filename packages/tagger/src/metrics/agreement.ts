import type { CharSpan } from "../text/bio";

/** Cohen's kappa of two annotators' per-token labels, with its parts (fractions) and n tokens. */
export type KappaResult = { kappa: number; observed: number; expected: number; n: number };

/** Exact-match agreement of two annotators' spans; see entityAgreement. */
export type EntityAgreement = { f1: number; precision: number; recall: number; matched: number; onlyA: number; onlyB: number };

/**
 * Cohen's kappa for two annotators labelling the same n items (Cohen 1960, "A Coefficient of
 * Agreement for Nominal Scales", Educational and Psychological Measurement 20(1)):
 * κ = (po − pe)/(1 − pe), with po the fraction of items labelled alike and pe = Σ_k pA(k)·pB(k)
 * from each annotator's own label distribution. Labels are any strings (e.g. IOB tags per token).
 *
 * pe = 1 happens only when both annotators used one and the same label throughout, so po = 1
 * too; κ is then defined as 1 (the formula gives 0/0). For n = 0 there is nothing to disagree
 * on and the result is the same: po = pe = κ = 1. Throws RangeError when the lengths differ.
 */
export function cohensKappa(a: readonly string[], b: readonly string[]): KappaResult {
  if (a.length !== b.length) throw new RangeError(`annotator A has ${a.length} labels but annotator B has ${b.length}`);
  const n = a.length;
  if (n === 0) return { kappa: 1, observed: 1, expected: 1, n };
  const countsA = new Map<string, number>();
  const countsB = new Map<string, number>();
  let agreed = 0;
  for (let i = 0; i < n; i++) {
    if (a[i] === b[i]) agreed++;
    countsA.set(a[i], (countsA.get(a[i]) ?? 0) + 1);
    countsB.set(b[i], (countsB.get(b[i]) ?? 0) + 1);
  }
  let expected = 0;
  for (const [label, countA] of countsA) expected += (countA / n) * ((countsB.get(label) ?? 0) / n);
  const observed = agreed / n;
  // Rounding can leave pe a hair off 1 in the degenerate case; decide it from the counts instead.
  const degenerate = countsA.size === 1 && countsB.size === 1 && agreed === n;
  const kappa = degenerate ? 1 : (observed - expected) / (1 - expected);
  return { kappa, observed, expected: degenerate ? 1 : expected, n };
}

function spanKey(span: CharSpan): string {
  return `${span.start}:${span.end}:${span.type}`;
}

/**
 * Span-level agreement of annotators A and B: a span matches when start, end and type are all
 * equal (each span matches at most one of the other's, so duplicates count once per copy).
 * With A as the reference, precision = matched/|B| and recall = matched/|A|; their harmonic mean
 * F1 = 2·matched/(|A| + |B|) is symmetric in A and B, which is why it serves as an agreement
 * measure (Hripcsak & Rothschild 2005, "Agreement, the F-measure, and reliability in information
 * retrieval", JAMIA 12(3)). A ratio with a zero denominator is 0, except that when both
 * annotators marked nothing they agree completely: precision = recall = F1 = 1.
 */
export function entityAgreement(a: readonly CharSpan[], b: readonly CharSpan[]): EntityAgreement {
  const unmatchedA = new Map<string, number>();
  for (const span of a) unmatchedA.set(spanKey(span), (unmatchedA.get(spanKey(span)) ?? 0) + 1);
  let matched = 0;
  for (const span of b) {
    const key = spanKey(span);
    const left = unmatchedA.get(key) ?? 0;
    if (left > 0) {
      matched++;
      unmatchedA.set(key, left - 1);
    }
  }
  const onlyA = a.length - matched;
  const onlyB = b.length - matched;
  if (a.length === 0 && b.length === 0) return { f1: 1, precision: 1, recall: 1, matched, onlyA, onlyB };
  return {
    f1: (2 * matched) / (a.length + b.length),
    precision: b.length > 0 ? matched / b.length : 0,
    recall: a.length > 0 ? matched / a.length : 0,
    matched,
    onlyA,
    onlyB,
  };
}
