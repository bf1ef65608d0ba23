import { checkShapes, type EmissionInput, type HmmParams } from "./hmm-params";
import type { Rng } from "../util/random";

/**
 * Draws one state sequence from P(states | observations) by forward filtering, backward sampling
 * (Carter & Kohn 1994, "On Gibbs sampling for state space models", Biometrika 81(3); Scott 2002,
 * "Bayesian methods for hidden Markov models", JASA 97, §3): the last state from
 * alpha_{T-1}(j)·P(end|j), then each earlier state from alpha_t(i)·P(s_{t+1} | i).
 *
 * @param alpha the T×K forward lattice of these params and input (computeForward).
 * @param out optional Int32Array of length ≥ T.
 */
export function sampleStatePath(params: HmmParams, input: EmissionInput, alpha: Float64Array, rng: Rng, out?: Int32Array): Int32Array {
  checkShapes(params, input, "sampleStatePath");
  const K = params.states;
  const T = input.length;
  if (alpha.length < T * K) throw new RangeError(`sampleStatePath: alpha has length ${alpha.length}, expected T×K=${T * K}`);
  const path = out ?? new Int32Array(T);
  if (path.length < T) throw new RangeError(`sampleStatePath: out has length ${path.length}, expected T=${T}`);
  if (T === 0) return path;
  const weights = new Float64Array(K);
  const draw = (): number => {
    let max = -Infinity;
    for (let k = 0; k < K; k++) if (weights[k] > max) max = weights[k];
    if (max === -Infinity) throw new RangeError("sampleStatePath: the observations have probability 0 under the model");
    let total = 0;
    for (let k = 0; k < K; k++) {
      weights[k] = Math.exp(weights[k] - max);
      total += weights[k];
    }
    let u = rng.next() * total;
    for (let k = 0; k < K; k++) {
      u -= weights[k];
      if (u < 0) return k;
    }
    // Rounding can leave u ≥ 0 after the last subtraction: take the last state with weight.
    for (let k = K - 1; k >= 0; k--) if (weights[k] > 0) return k;
    return K - 1;
  };
  const last = (T - 1) * K;
  for (let k = 0; k < K; k++) weights[k] = alpha[last + k] + (params.end === null ? 0 : params.end[k]);
  path[T - 1] = draw();
  const KK = K * K;
  for (let t = T - 2; t >= 0; t--) {
    const next = path[t + 1];
    const m = input.transitionIndex === null ? 0 : input.transitionIndex[t + 1] * KK;
    for (let i = 0; i < K; i++) weights[i] = alpha[t * K + i] + params.transitions[m + i * K + next];
    path[t] = draw();
  }
  return path;
}
