import type { Rng } from "../util/random";
import { checkSameShape } from "./check-shapes";
import { computeF1, scoreEntities } from "./entity-scores";

/** Documents → sentences → IOB tags. */
type TaggedDocuments = readonly (readonly (readonly string[])[])[];

/** Result of pairedBootstrap; F1 values and delta are fractions in [0, 1] and [-1, 1]. */
export type PairedBootstrapResult = {
  f1A: number;
  f1B: number;
  delta: number;
  ci: [number, number];
  pValue: number;
  samples: number;
};

// Sample quantile by linear interpolation between order statistics: definition 7 of Hyndman &
// Fan (1996), "Sample Quantiles in Statistical Packages", The American Statistician 50(4).
function quantileOfSorted(sorted: Float64Array, q: number): number {
  const h = (sorted.length - 1) * q;
  const lo = Math.floor(h);
  const hi = Math.min(lo + 1, sorted.length - 1);
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}

/**
 * Paired bootstrap comparison of taggers A and B on the same gold documents
 * (documents → sentences → tags, IOB).
 *
 * Each of `samples` (default 1000) bootstrap test sets draws as many documents as there are, with
 * replacement, from the test set (Koehn 2004, "Statistical Significance Tests for Machine
 * Translation Evaluation", EMNLP: paired bootstrap resampling, there over sentences). Documents
 * are the units here because tokens and sentences within a document are not independent. On
 * each sample both taggers' micro F1 is recomputed from summed chunk counts (correct, predicted,
 * gold; never an average of per-document F1s), giving delta* = F1(B) − F1(A).
 *
 * - `delta` = F1(B) − F1(A) on the whole test set.
 * - `ci`: the percentile interval of delta* at `confidence` (default 0.95), quantiles by linear
 *   interpolation (Hyndman & Fan 1996, definition 7).
 * - `pValue`, for "B is better than A": the fraction of samples with delta* > 2·delta, the test of
 *   Berg-Kirkpatrick, Burkett & Klein (2012), "An Empirical Investigation of Statistical
 *   Significance in NLP", EMNLP, §2–3. The bootstrap distribution is centred near delta rather
 *   than 0, so it is shifted by delta to stand in for the null hypothesis. The test presupposes an
 *   observed improvement; when delta ≤ 0 there is none to test and pValue is 1 (swap A and B to
 *   test the other direction).
 *
 * Deterministic for a given `rng` state. Throws RangeError when fewer than 2 documents are given
 * (every resample of one document is the test set itself), when the three inputs disagree in
 * shape (naming the document and sentence), or on bad options.
 */
export function pairedBootstrap(
  input: { gold: string[][][]; a: string[][][]; b: string[][][] },
  options: { samples?: number; rng: Rng; confidence?: number },
): PairedBootstrapResult {
  const gold: TaggedDocuments = input.gold;
  const samples = options.samples ?? 1000;
  const confidence = options.confidence ?? 0.95;
  if (!Number.isInteger(samples) || samples < 1) throw new RangeError(`samples must be a positive integer, got ${samples}`);
  if (!(confidence > 0 && confidence < 1)) throw new RangeError(`confidence must lie in (0, 1), got ${confidence}`);
  const documents = gold.length;
  if (input.a.length !== documents || input.b.length !== documents) {
    throw new RangeError(`gold has ${documents} documents, tagger A ${input.a.length}, tagger B ${input.b.length}`);
  }
  if (documents < 2) throw new RangeError(`the paired bootstrap needs at least 2 documents, got ${documents}`);

  const goldCounts = new Float64Array(documents);
  const correctA = new Float64Array(documents);
  const predictedA = new Float64Array(documents);
  const correctB = new Float64Array(documents);
  const predictedB = new Float64Array(documents);
  let totalGold = 0;
  let totalCorrectA = 0;
  let totalPredictedA = 0;
  let totalCorrectB = 0;
  let totalPredictedB = 0;
  for (let d = 0; d < documents; d++) {
    checkSameShape(gold[d], input.a[d], `document ${d}, tagger A`);
    checkSameShape(gold[d], input.b[d], `document ${d}, tagger B`);
    const scoresA = scoreEntities(gold[d], input.a[d]).overall;
    const scoresB = scoreEntities(gold[d], input.b[d]).overall;
    goldCounts[d] = scoresA.gold;
    correctA[d] = scoresA.correct;
    predictedA[d] = scoresA.predicted;
    correctB[d] = scoresB.correct;
    predictedB[d] = scoresB.predicted;
    totalGold += scoresA.gold;
    totalCorrectA += scoresA.correct;
    totalPredictedA += scoresA.predicted;
    totalCorrectB += scoresB.correct;
    totalPredictedB += scoresB.predicted;
  }
  const f1A = computeF1(totalCorrectA, totalPredictedA, totalGold);
  const f1B = computeF1(totalCorrectB, totalPredictedB, totalGold);
  const delta = f1B - f1A;

  const deltas = new Float64Array(samples);
  let beyond = 0;
  for (let s = 0; s < samples; s++) {
    let g = 0;
    let cA = 0;
    let pA = 0;
    let cB = 0;
    let pB = 0;
    for (let k = 0; k < documents; k++) {
      const d = options.rng.nextInt(documents);
      g += goldCounts[d];
      cA += correctA[d];
      pA += predictedA[d];
      cB += correctB[d];
      pB += predictedB[d];
    }
    const sampled = computeF1(cB, pB, g) - computeF1(cA, pA, g);
    deltas[s] = sampled;
    if (sampled > 2 * delta) beyond++;
  }
  deltas.sort();
  const alpha = 1 - confidence;
  return {
    f1A,
    f1B,
    delta,
    ci: [quantileOfSorted(deltas, alpha / 2), quantileOfSorted(deltas, 1 - alpha / 2)],
    pValue: delta > 0 ? beyond / samples : 1,
    samples,
  };
}
