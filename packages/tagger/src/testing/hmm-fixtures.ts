/**
 * Worked-example HMMs from published sources and a brute-force enumerator, used only by tests.
 * Each fixture names its source; the expected numbers live in the tests beside the kernels.
 */
import { createHmmFromProbabilities, type EmissionInput, type HmmParams } from "../kernels/hmm-params";
import type { Rng } from "../util/random";

/**
 * Jurafsky & Martin, Speech and Language Processing, 3rd ed. draft, Appendix A "Hidden Markov
 * Models", ice-cream HMM without an end state. States 0 = HOT, 1 = COLD; symbols 0,1,2 = 1,2,3
 * ice creams.
 */
export const iceCream = createHmmFromProbabilities({
  start: [0.8, 0.2],
  transition: [
    [0.6, 0.4],
    [0.5, 0.5],
  ],
  emission: [
    [0.2, 0.4, 0.4],
    [0.5, 0.4, 0.1],
  ],
});

/**
 * Russell & Norvig, Artificial Intelligence: A Modern Approach, 3rd ed., §15.2, umbrella world.
 * States 0 = rain, 1 = no rain; symbols 0 = umbrella, 1 = no umbrella.
 */
export const umbrella = createHmmFromProbabilities({
  start: [0.5, 0.5],
  transition: [
    [0.7, 0.3],
    [0.3, 0.7],
  ],
  emission: [
    [0.9, 0.1],
    [0.2, 0.8],
  ],
});

/**
 * Wikipedia, "Viterbi algorithm", worked example. States 0 = Healthy, 1 = Fever; symbols
 * 0 = normal, 1 = cold, 2 = dizzy.
 */
export const healthFever = createHmmFromProbabilities({
  start: [0.6, 0.4],
  transition: [
    [0.7, 0.3],
    [0.4, 0.6],
  ],
  emission: [
    [0.5, 0.4, 0.1],
    [0.1, 0.3, 0.6],
  ],
});

/**
 * Eisner (2002), "An Interactive Spreadsheet for Teaching the Forward-Backward Algorithm".
 * States 0 = C(old), 1 = H(ot); symbols 0,1,2 = 1,2,3 ice creams; STOP probability 0.1 from
 * either state.
 */
export const eisner = createHmmFromProbabilities({
  start: [0.5, 0.5],
  transition: [
    [0.8, 0.1],
    [0.1, 0.8],
  ],
  emission: [
    [0.7, 0.2, 0.1],
    [0.1, 0.2, 0.7],
  ],
  end: [0.1, 0.1],
});

/** Eisner's 33 days of ice-cream counts (1-3). */
export const eisnerDays = [2, 3, 3, 2, 3, 2, 3, 2, 2, 3, 1, 3, 3, 1, 1, 1, 2, 1, 1, 1, 3, 1, 2, 1, 1, 1, 2, 3, 3, 2, 3, 2, 2];

/** Symbol ids (count − 1) for a list of ice-cream counts. */
export function iceCreamSymbols(counts: readonly number[]): Int32Array {
  return Int32Array.from(counts, (c) => c - 1);
}

/** A gather input over an emission table for the given symbols. */
export function symbolsInput(emissionTable: Float64Array, symbols: Int32Array, transitionIndex: Int32Array | null = null): EmissionInput {
  return { length: symbols.length, scores: emissionTable, rows: symbols, transitionIndex };
}

/** Joint log P(path, observations) of one path, straight from the definition. */
export function pathLogProbability(params: HmmParams, input: EmissionInput, path: ArrayLike<number>): number {
  const K = params.states;
  const T = input.length;
  let total = 0;
  for (let t = 0; t < T; t++) {
    const row = input.rows === null ? t : input.rows[t];
    const emission = input.scores[row * K + path[t]];
    if (t === 0) {
      total += params.start[path[0]] + emission;
    } else {
      const m = input.transitionIndex === null ? 0 : input.transitionIndex[t];
      total += params.transitions[m * K * K + path[t - 1] * K + path[t]] + emission;
    }
  }
  if (params.end !== null && T > 0) total += params.end[path[T - 1]];
  return total;
}

/**
 * Enumerates all K^T paths: the best path (first in lexicographic order among ties), its log
 * probability, the total probability and the posterior marginals (T×K probabilities).
 */
export function enumeratePaths(params: HmmParams, input: EmissionInput): {
  bestPath: Int32Array;
  bestLogProbability: number;
  logLikelihood: number;
  posteriors: Float64Array;
} {
  const K = params.states;
  const T = input.length;
  const path = new Int32Array(T);
  const bestPath = new Int32Array(T);
  let best = -Infinity;
  const probs: number[] = [];
  const paths: Int32Array[] = [];
  const total = K ** T;
  for (let n = 0; n < total; n++) {
    let rest = n;
    // Most significant digit first, so n enumerates paths in lexicographic order.
    for (let t = T - 1; t >= 0; t--) {
      path[t] = rest % K;
      rest = Math.floor(rest / K);
    }
    const lp = pathLogProbability(params, input, path);
    probs.push(lp);
    paths.push(path.slice());
    if (lp > best) {
      best = lp;
      bestPath.set(path);
    }
  }
  const max = Math.max(...probs);
  let sum = 0;
  for (const lp of probs) sum += Math.exp(lp - max);
  const logLikelihood = max + Math.log(sum);
  const posteriors = new Float64Array(T * K);
  probs.forEach((lp, n) => {
    const w = Math.exp(lp - logLikelihood);
    for (let t = 0; t < T; t++) posteriors[t * K + paths[n][t]] += w;
  });
  return { bestPath, bestLogProbability: best, logLikelihood, posteriors };
}

/** Draws a probability vector of length n with entries bounded away from 0. */
function randomDistribution(rng: Rng, n: number): number[] {
  const raw = Array.from({ length: n }, () => 0.05 + rng.next());
  const sum = raw.reduce((a, b) => a + b, 0);
  return raw.map((x) => x / sum);
}

/** A random HMM with K states and V symbols (optionally with an end distribution and M matrices). */
export function randomHmm(rng: Rng, K: number, V: number, options: { end?: boolean; matrices?: number } = {}): { params: HmmParams; emissionTable: Float64Array } {
  const matrices = options.matrices ?? 1;
  const start = Float64Array.from(randomDistribution(rng, K), Math.log);
  const transitions = new Float64Array(matrices * K * K);
  for (let m = 0; m < matrices; m++) {
    for (let i = 0; i < K; i++) {
      // With an end state, each row leaves room for P(end | i).
      const row = randomDistribution(rng, options.end === true ? K + 1 : K);
      for (let j = 0; j < K; j++) transitions[m * K * K + i * K + j] = Math.log(row[j]);
    }
  }
  let end: Float64Array | null = null;
  if (options.end === true) {
    end = new Float64Array(K);
    for (let i = 0; i < K; i++) {
      let rest = 0;
      for (let j = 0; j < K; j++) rest += Math.exp(transitions[i * K + j]);
      end[i] = Math.log(Math.max(1e-12, 1 - rest));
    }
  }
  const emissionTable = new Float64Array(V * K);
  for (let k = 0; k < K; k++) {
    const row = randomDistribution(rng, V);
    for (let v = 0; v < V; v++) emissionTable[v * K + k] = Math.log(row[v]);
  }
  return { params: { states: K, start, transitions, end }, emissionTable };
}
