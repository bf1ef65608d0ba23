import { accumulateTransitionPosteriors, computePosteriors } from "../kernels/forward-backward";
import { gatherInput, type HmmParams } from "../kernels/hmm-params";
import { createTransitionCache } from "../kernels/transition-cache";

/** Expected counts of one E-step over a set of symbol sequences (probability space). */
export type ExpectedCounts = {
  readonly start: Float64Array;
  /** K×K expected transitions [from][to]. */
  readonly transitions: Float64Array;
  /** K expected sentence ends, or null when the model has no end state. */
  readonly end: Float64Array | null;
  /** V×K expected (symbol, state) counts. */
  readonly emissions: Float64Array;
  /** Σ log P(sequence) under the parameters that produced these counts. */
  readonly logLikelihood: number;
};

/**
 * E-step of Baum–Welch (Baum et al. 1970; Rabiner 1989 §III-C, eq. 37-40): posterior expected
 * start, transition, end and emission counts of a single-matrix HMM over symbol sequences.
 */
export function computeExpectedCounts(params: HmmParams, emissionTable: Float64Array, sequences: readonly Int32Array[]): ExpectedCounts {
  const K = params.states;
  if (params.transitions.length !== K * K) throw new RangeError(`computeExpectedCounts: needs one K×K transition matrix, got length ${params.transitions.length}`);
  const V = emissionTable.length / K;
  const start = new Float64Array(K);
  const transitions = new Float64Array(K * K);
  const end = params.end === null ? null : new Float64Array(K);
  const emissions = new Float64Array(emissionTable.length);
  const cache = createTransitionCache();
  let logLikelihood = 0;
  for (const sequence of sequences) {
    if (sequence.length === 0) continue;
    const input = gatherInput(emissionTable, sequence);
    const post = computePosteriors(params, input, {}, cache);
    logLikelihood += post.logLikelihood;
    accumulateTransitionPosteriors(params, input, post, 1, transitions, start, end);
    for (let t = 0; t < sequence.length; t++) {
      const s = sequence[t];
      if (s < 0 || s >= V) throw new RangeError(`computeExpectedCounts: symbol ${s} outside V=${V}`);
      for (let k = 0; k < K; k++) emissions[s * K + k] += post.posteriors[t * K + k];
    }
  }
  return { start, transitions, end, emissions, logLikelihood };
}

/**
 * M-step: maximum-likelihood parameters from expected counts (each distribution normalised; a row
 * with no expected mass keeps the previous parameters' row, so it stays a distribution).
 */
export function maximizeExpectedCounts(counts: ExpectedCounts, previous: HmmParams, previousEmissions: Float64Array): { params: HmmParams; emissionTable: Float64Array } {
  const K = previous.states;
  const V = previousEmissions.length / K;
  const normalize = (values: Float64Array, offset: number, count: number, extra: number, fallback: Float64Array, fallbackOffset: number, out: Float64Array, outOffset: number) => {
    let total = extra;
    for (let x = 0; x < count; x++) total += values[offset + x];
    for (let x = 0; x < count; x++) out[outOffset + x] = total > 0 ? Math.log(values[offset + x] / total) : fallback[fallbackOffset + x];
    return total;
  };
  const start = new Float64Array(K);
  normalize(counts.start, 0, K, 0, previous.start, 0, start, 0);
  const transitions = new Float64Array(K * K);
  const end = counts.end === null ? null : new Float64Array(K);
  for (let i = 0; i < K; i++) {
    const total = normalize(counts.transitions, i * K, K, counts.end === null ? 0 : counts.end[i], previous.transitions, i * K, transitions, i * K);
    if (end !== null && counts.end !== null) end[i] = total > 0 ? Math.log(counts.end[i] / total) : previous.end![i];
  }
  // Emissions are stored symbol-major (V×K) but normalised per state (over symbols).
  const emissionTable = new Float64Array(V * K);
  for (let k = 0; k < K; k++) {
    let total = 0;
    for (let v = 0; v < V; v++) total += counts.emissions[v * K + k];
    for (let v = 0; v < V; v++) emissionTable[v * K + k] = total > 0 ? Math.log(counts.emissions[v * K + k] / total) : previousEmissions[v * K + k];
  }
  return { params: { states: K, start, transitions, end }, emissionTable };
}

/**
 * Baum–Welch: alternates E- and M-steps from the given parameters. `history[n]` is the data
 * log-likelihood before update n (so history[0] is that of the initial parameters); it never
 * decreases (Baum et al. 1970). Stops after `iterations` updates, or earlier when an update gains
 * less than `tolerance` (then `converged` is true). Inputs are not modified.
 */
export function trainBaumWelch(
  params: HmmParams,
  emissionTable: Float64Array,
  sequences: readonly Int32Array[],
  options: { iterations: number; tolerance?: number },
): { params: HmmParams; emissionTable: Float64Array; history: number[]; converged: boolean } {
  let current = { params, emissionTable };
  const history: number[] = [];
  let converged = false;
  for (let n = 0; n < options.iterations; n++) {
    const counts = computeExpectedCounts(current.params, current.emissionTable, sequences);
    if (history.length > 0 && options.tolerance !== undefined && counts.logLikelihood - history[history.length - 1] < options.tolerance) {
      history.push(counts.logLikelihood);
      converged = true;
      break;
    }
    history.push(counts.logLikelihood);
    current = maximizeExpectedCounts(counts, current.params, current.emissionTable);
  }
  return { ...current, history, converged };
}
