import type { HmmParams } from "./hmm-params";

/**
 * Transition probabilities exp(transitions), computed once per parameter set and reused by the
 * forward and backward kernels. Their inner loops then multiply instead of calling exp K² times
 * per token. Parameters are readonly plain data, so a cache keyed by the array is safe.
 */
export type TransitionCache = { source: Float64Array | null; probabilities: Float64Array };

/** An empty cache; pass the same object to successive calls with the same parameters. */
export function createTransitionCache(): TransitionCache {
  return { source: null, probabilities: new Float64Array(0) };
}

/** exp of every transition log-probability, recomputed only when the parameters changed. */
export function transitionProbabilities(params: HmmParams, cache: TransitionCache | undefined): Float64Array {
  if (cache !== undefined && cache.source === params.transitions) return cache.probabilities;
  const logs = params.transitions;
  const probabilities = cache !== undefined && cache.probabilities.length === logs.length ? cache.probabilities : new Float64Array(logs.length);
  for (let x = 0; x < logs.length; x++) probabilities[x] = Math.exp(logs[x]);
  if (cache !== undefined) {
    cache.source = logs;
    cache.probabilities = probabilities;
  }
  return probabilities;
}

/**
 * Below this, a sum of rescaled probabilities has lost relative precision (subnormal range is
 * ~1e-308; leave a wide margin); kernels then redo that cell with the exact per-cell logSumExp.
 */
export const RESCALED_SUM_FLOOR = 1e-250;
