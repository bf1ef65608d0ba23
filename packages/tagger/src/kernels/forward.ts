import { checkShapes, type EmissionInput, type HmmParams } from "./hmm-params";
import { logSumExp } from "../util/math";
import { RESCALED_SUM_FLOOR, transitionProbabilities, type TransitionCache } from "./transition-cache";

/**
 * Forward algorithm (Rabiner 1989, "A tutorial on hidden Markov models", §III-A, eq. 19-21) in
 * log space: alpha[t][j] = log P(o_0..o_t, s_t = j).
 *
 * Each step shares one shift m = max_i alpha[t-1][i]: alpha[t][j] = m + log Σ_i exp(alpha[t-1][i]
 * - m)·P(j|i) + e_t[j]. That is the log-sum-exp identity with a common shift, so the inner loop
 * multiplies instead of calling exp; a cell whose rescaled sum falls below RESCALED_SUM_FLOOR is
 * recomputed with the exact per-cell logSumExp, so extreme parameters lose no precision.
 *
 * @param out optional T×K buffer for alpha.
 * @returns alpha (T×K, log) and log P(observations) (including the end distribution if any).
 */
export function computeForward(
  params: HmmParams,
  input: EmissionInput,
  out?: Float64Array,
  cache?: TransitionCache,
): { alpha: Float64Array; logLikelihood: number } {
  checkShapes(params, input, "computeForward");
  const K = params.states;
  const T = input.length;
  const alpha = out ?? new Float64Array(T * K);
  if (alpha.length < T * K) throw new RangeError(`computeForward: out has length ${alpha.length}, expected T×K=${T * K}`);
  if (T === 0) return { alpha, logLikelihood: 0 };
  const { start, transitions: logTrans, end } = params;
  const prob = transitionProbabilities(params, cache);
  const em = input.scores;
  const rows = input.rows;
  const tIndex = input.transitionIndex;
  const KK = K * K;
  const scaled = new Float64Array(K);
  const terms = new Float64Array(K);

  let e = (rows === null ? 0 : rows[0]) * K;
  for (let j = 0; j < K; j++) alpha[j] = start[j] + em[e + j];
  for (let t = 1; t < T; t++) {
    const prev = (t - 1) * K;
    const cur = t * K;
    e = (rows === null ? t : rows[t]) * K;
    const m = tIndex === null ? 0 : tIndex[t] * KK;
    let shift = -Infinity;
    for (let i = 0; i < K; i++) if (alpha[prev + i] > shift) shift = alpha[prev + i];
    if (shift === -Infinity) {
      for (let j = 0; j < K; j++) alpha[cur + j] = -Infinity;
      continue;
    }
    for (let i = 0; i < K; i++) scaled[i] = Math.exp(alpha[prev + i] - shift);
    for (let j = 0; j < K; j++) {
      let sum = 0;
      for (let i = 0, a = m + j; i < K; i++, a += K) sum += scaled[i] * prob[a];
      if (sum >= RESCALED_SUM_FLOOR) {
        alpha[cur + j] = shift + Math.log(sum) + em[e + j];
      } else {
        for (let i = 0, a = m + j; i < K; i++, a += K) terms[i] = alpha[prev + i] + logTrans[a];
        alpha[cur + j] = logSumExp(terms, 0, K) + em[e + j];
      }
    }
  }
  const last = (T - 1) * K;
  let logLikelihood: number;
  if (end === null) {
    logLikelihood = logSumExp(alpha, last, K);
  } else {
    for (let j = 0; j < K; j++) terms[j] = alpha[last + j] + end[j];
    logLikelihood = logSumExp(terms, 0, K);
  }
  return { alpha, logLikelihood };
}
