import { checkShapes, type EmissionInput, type HmmParams } from "./hmm-params";
import { logSumExp } from "../util/math";
import { RESCALED_SUM_FLOOR, transitionProbabilities, type TransitionCache } from "./transition-cache";

/**
 * Backward algorithm (Rabiner 1989, §III-A, eq. 23-25) in log space:
 * beta[t][i] = log P(o_{t+1}..o_{T-1} [, end] | s_t = i). Same common-shift evaluation and exact
 * fallback as {@link computeForward}.
 *
 * @param out optional T×K buffer.
 * @returns beta, T×K log-space lattice.
 */
export function computeBackward(params: HmmParams, input: EmissionInput, out?: Float64Array, cache?: TransitionCache): Float64Array {
  checkShapes(params, input, "computeBackward");
  const K = params.states;
  const T = input.length;
  const beta = out ?? new Float64Array(T * K);
  if (beta.length < T * K) throw new RangeError(`computeBackward: out has length ${beta.length}, expected T×K=${T * K}`);
  if (T === 0) return beta;
  const { transitions: logTrans, end } = params;
  const prob = transitionProbabilities(params, cache);
  const em = input.scores;
  const rows = input.rows;
  const tIndex = input.transitionIndex;
  const KK = K * K;
  const scaled = new Float64Array(K);
  const terms = new Float64Array(K);
  const exact = new Float64Array(K);

  const last = (T - 1) * K;
  for (let i = 0; i < K; i++) beta[last + i] = end === null ? 0 : end[i];
  for (let t = T - 2; t >= 0; t--) {
    const cur = t * K;
    const next = (t + 1) * K;
    const e = (rows === null ? t + 1 : rows[t + 1]) * K;
    const m = tIndex === null ? 0 : tIndex[t + 1] * KK;
    // terms[j] = e_{t+1}[j] + beta[t+1][j], shared by every i.
    let shift = -Infinity;
    for (let j = 0; j < K; j++) {
      const v = em[e + j] + beta[next + j];
      terms[j] = v;
      if (v > shift) shift = v;
    }
    if (shift === -Infinity) {
      for (let i = 0; i < K; i++) beta[cur + i] = -Infinity;
      continue;
    }
    for (let j = 0; j < K; j++) scaled[j] = Math.exp(terms[j] - shift);
    for (let i = 0; i < K; i++) {
      const row = m + i * K;
      let sum = 0;
      for (let j = 0; j < K; j++) sum += prob[row + j] * scaled[j];
      if (sum >= RESCALED_SUM_FLOOR) {
        beta[cur + i] = shift + Math.log(sum);
      } else {
        for (let j = 0; j < K; j++) exact[j] = logTrans[row + j] + terms[j];
        beta[cur + i] = logSumExp(exact, 0, K);
      }
    }
  }
  return beta;
}
