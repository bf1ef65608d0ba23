import type { Rng } from "../util/random";

/** One point of a learning curve: train on these documents (ascending indices). */
export type LearningCurveStep = { fraction: number; documentIndices: number[] };

const DEFAULT_FRACTIONS = [0.1, 0.25, 0.5, 0.75, 1];

/**
 * Plans a learning curve over `documentCount` training documents: for each fraction (strictly
 * increasing, in (0, 1]; default 0.1, 0.25, 0.5, 0.75, 1) a random subset of
 * max(1, round(fraction · documentCount)) documents, nested so that every subset contains the
 * smaller ones — the curve then measures more data, not different data. The subsets are prefixes
 * of one uniform random permutation (Fisher–Yates shuffle; Knuth, The Art of Computer Programming,
 * Vol. 2, 3rd ed., §3.4.2, Algorithm P). With few documents neighbouring steps may have the same
 * size. A pure planner: the caller trains and evaluates each step.
 */
export function learningCurvePlan(documentCount: number, options: { fractions?: number[]; rng: Rng }): LearningCurveStep[] {
  if (!Number.isInteger(documentCount) || documentCount < 1) {
    throw new RangeError(`documentCount must be a positive integer, got ${documentCount}`);
  }
  const fractions = options.fractions ?? DEFAULT_FRACTIONS;
  if (fractions.length === 0) throw new RangeError("fractions must not be empty");
  fractions.forEach((f, k) => {
    if (!(f > 0 && f <= 1)) throw new RangeError(`fraction ${k} must lie in (0, 1], got ${f}`);
    if (k > 0 && !(f > fractions[k - 1])) throw new RangeError(`fractions must increase: ${fractions[k - 1]} then ${f}`);
  });
  const order = Array.from({ length: documentCount }, (_, i) => i);
  for (let i = documentCount - 1; i > 0; i--) {
    const j = options.rng.nextInt(i + 1);
    const held = order[i];
    order[i] = order[j];
    order[j] = held;
  }
  return fractions.map((fraction) => {
    const size = Math.max(1, Math.round(fraction * documentCount));
    return { fraction, documentIndices: order.slice(0, size).sort((a, b) => a - b) };
  });
}
