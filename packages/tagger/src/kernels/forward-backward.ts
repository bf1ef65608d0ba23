import { computeBackward } from "./backward";
import { computeForward } from "./forward";
import { checkShapes, type EmissionInput, type HmmParams } from "./hmm-params";
import type { TransitionCache } from "./transition-cache";

/** Output of {@link computePosteriors}; all lattices are T×K, row-major. */
export type Posteriors = {
  /** P(s_t = j | observations), probabilities (not logs); each row sums to 1. */
  readonly posteriors: Float64Array;
  /** log P(observations). */
  readonly logLikelihood: number;
  readonly alpha: Float64Array;
  readonly beta: Float64Array;
};

/** Optional reusable T×K buffers for {@link computePosteriors}. */
export type PosteriorBuffers = { alpha?: Float64Array; beta?: Float64Array; posteriors?: Float64Array };

/**
 * Forward-backward posterior marginals (Rabiner 1989, §III-C, eq. 27):
 * gamma[t][j] = exp(alpha[t][j] + beta[t][j] - log P(O)).
 *
 * Throws RangeError when the observations have probability 0 under the model, because the
 * posteriors are then undefined.
 */
export function computePosteriors(params: HmmParams, input: EmissionInput, buffers: PosteriorBuffers = {}, cache?: TransitionCache): Posteriors {
  checkShapes(params, input, "computePosteriors");
  const K = params.states;
  const T = input.length;
  const { alpha, logLikelihood } = computeForward(params, input, buffers.alpha, cache);
  const beta = computeBackward(params, input, buffers.beta, cache);
  const posteriors = buffers.posteriors ?? new Float64Array(T * K);
  if (posteriors.length < T * K) throw new RangeError(`computePosteriors: posteriors buffer has length ${posteriors.length}, expected T×K=${T * K}`);
  if (T > 0 && logLikelihood === -Infinity) throw new RangeError("computePosteriors: the observations have probability 0 under the model");
  for (let x = 0; x < T * K; x++) posteriors[x] = Math.exp(alpha[x] + beta[x] - logLikelihood);
  return { posteriors, logLikelihood, alpha, beta };
}

/**
 * Adds weight × the expected transition counts of one sequence, Σ_t xi_t(i, j) with
 * xi_t(i,j) = P(s_{t-1}=i, s_t=j | O) (Rabiner 1989, eq. 37), into `target` (M×K×K, the same
 * layout as params.transitions: step t goes to matrix transitionIndex[t]). Also adds the start and
 * end posteriors to `startTarget`/`endTarget` (K each) when given.
 */
export function accumulateTransitionPosteriors(
  params: HmmParams,
  input: EmissionInput,
  posteriors: Posteriors,
  weight: number,
  target: Float64Array,
  startTarget: Float64Array | null,
  endTarget: Float64Array | null,
): void {
  checkShapes(params, input, "accumulateTransitionPosteriors");
  const K = params.states;
  const T = input.length;
  const KK = K * K;
  if (target.length !== params.transitions.length) {
    throw new RangeError(`accumulateTransitionPosteriors: target has length ${target.length}, transitions ${params.transitions.length}`);
  }
  if (startTarget !== null && startTarget.length !== K) throw new RangeError(`accumulateTransitionPosteriors: startTarget length ${startTarget.length}, K=${K}`);
  if (endTarget !== null && endTarget.length !== K) throw new RangeError(`accumulateTransitionPosteriors: endTarget length ${endTarget.length}, K=${K}`);
  if (T === 0) return;
  const { alpha, beta, logLikelihood, posteriors: gamma } = posteriors;
  const logTrans = params.transitions;
  const em = input.scores;
  const rows = input.rows;
  const tIndex = input.transitionIndex;
  const right = new Float64Array(K);
  if (startTarget !== null) for (let j = 0; j < K; j++) startTarget[j] += weight * gamma[j];
  if (endTarget !== null) for (let j = 0; j < K; j++) endTarget[j] += weight * gamma[(T - 1) * K + j];
  for (let t = 1; t < T; t++) {
    const prev = (t - 1) * K;
    const cur = t * K;
    const e = (rows === null ? t : rows[t]) * K;
    const m = tIndex === null ? 0 : tIndex[t] * KK;
    for (let j = 0; j < K; j++) right[j] = em[e + j] + beta[cur + j] - logLikelihood;
    for (let i = 0; i < K; i++) {
      const left = alpha[prev + i];
      if (left === -Infinity) continue;
      const row = m + i * K;
      for (let j = 0; j < K; j++) target[row + j] += weight * Math.exp(left + logTrans[row + j] + right[j]);
    }
  }
}
