import { checkShapes, transitionMatrixCount, type EmissionInput, type HmmParams } from "./hmm-params";
import { UNROLL_LIMIT, unrolledForward } from "./viterbi-unrolled";
import { WASM_STATE_LIMIT, decodeViterbiWasm, isWasmSimdAvailable } from "./viterbi-wasm";

/** Reusable buffers for {@link decodeViterbi}: a T×K score lattice and T×K backpointers. */
export type ViterbiWorkspace = { delta: Float64Array; backpointers: Int32Array };

/** Buffers large enough for sequences of up to `maxLength` tokens over K states. */
export function createViterbiWorkspace(states: number, maxLength: number): ViterbiWorkspace {
  return { delta: new Float64Array(states * maxLength), backpointers: new Int32Array(states * maxLength) };
}

/**
 * Most probable state sequence of a first-order HMM (Viterbi 1967; the max-product recursion as
 * in Rabiner 1989, "A tutorial on hidden Markov models", §III-B), in log space.
 *
 * Ties go to the lowest state index, both in the recursion and at the last token, so results
 * are deterministic. Forbidden transitions are -Infinity in the parameters (e.g. IOB2
 * constraints); if every path is impossible the log-probability is -Infinity.
 *
 * @param out optional Int32Array of length ≥ T for the path (else one is allocated).
 * @param workspace optional reusable buffers; they must hold T×K entries (RangeError otherwise).
 * @returns the path (T state ids) and its joint log-probability log P(path, observations).
 */
export function decodeViterbi(
  params: HmmParams,
  input: EmissionInput,
  out?: Int32Array,
  workspace?: ViterbiWorkspace,
): { path: Int32Array; logProbability: number } {
  checkShapes(params, input, "decodeViterbi");
  const K = params.states;
  const T = input.length;
  const path = out ?? new Int32Array(T);
  if (path.length < T) throw new RangeError(`decodeViterbi: out has length ${path.length}, expected T=${T}`);
  if (T === 0) return { path, logProbability: 0 };
  if (workspace !== undefined && (workspace.delta.length < T * K || workspace.backpointers.length < T * K)) {
    throw new RangeError(`decodeViterbi: workspace holds ${workspace.delta.length / K} tokens, sequence has T=${T}`);
  }
  if (K <= WASM_STATE_LIMIT && isWasmSimdAvailable()) {
    // Same recursion and results, branch-free in WebAssembly SIMD (viterbi-wasm.ts); null when the
    // scores hold a case it leaves to the JavaScript paths below (NaN, +Infinity, a −0 entry).
    const logProbability = decodeViterbiWasm(params, input, path, workspace === undefined ? null : workspace.delta);
    if (logProbability !== null) return { path, logProbability };
  }
  return decodeViterbiJs(params, input, path, workspace);
}

/**
 * The JavaScript paths of {@link decodeViterbi} (compiled per K up to UNROLL_LIMIT, plain loops
 * beyond), for engines without WebAssembly SIMD and the inputs the kernel declines; exported so
 * that the tests can hold the kernels to each other, and for the tagging path, whose step
 * matrices sit in a large per-model cache that the WebAssembly kernel would copy whole.
 * Expects checked shapes and T ≥ 1.
 */
export function decodeViterbiJs(params: HmmParams, input: EmissionInput, path: Int32Array, workspace?: ViterbiWorkspace): { path: Int32Array; logProbability: number } {
  const K = params.states;
  const T = input.length;
  let delta: Float64Array;
  let bp: Int32Array;
  if (workspace !== undefined) {
    delta = workspace.delta;
    bp = workspace.backpointers;
  } else {
    delta = new Float64Array(T * K);
    bp = new Int32Array(T * K);
  }
  const { start, transitions: trans, end } = params;
  const em = input.scores;
  const rows = input.rows;
  const tIndex = input.transitionIndex;
  const KK = K * K;

  if (K <= UNROLL_LIMIT && T > 1) {
    // Same recursion, compiled for this K (viterbi-unrolled.ts); argmaxes come from the backtrace.
    const shared = tIndex === null || transitionMatrixCount(params) === 1;
    unrolledForward(K, shared)(T, start, trans, em, rows, shared ? null : tIndex, delta);
    return backtrack(params, input, delta, path);
  }
  let e = (rows === null ? 0 : rows[0]) * K;
  for (let j = 0; j < K; j++) delta[j] = start[j] + em[e + j];
  for (let t = 1; t < T; t++) {
    const prev = (t - 1) * K;
    const cur = t * K;
    e = (rows === null ? t : rows[t]) * K;
    const m = tIndex === null ? 0 : tIndex[t] * KK;
    for (let j = 0; j < K; j++) {
      let best = delta[prev] + trans[m + j];
      let arg = 0;
      for (let i = 1, a = m + K + j; i < K; i++, a += K) {
        const s = delta[prev + i] + trans[a];
        if (s > best) {
          best = s;
          arg = i;
        }
      }
      delta[cur + j] = best + em[e + j];
      bp[cur + j] = arg;
    }
  }
  let arg = bestLastState(delta, T, K, end);
  const best = delta[(T - 1) * K + arg] + (end === null ? 0 : end[arg]);
  path[T - 1] = arg;
  for (let t = T - 1; t > 0; t--) {
    arg = bp[t * K + arg];
    path[t - 1] = arg;
  }
  return { path, logProbability: best };
}

/** The best state at the last token (end scores included), ties to the lowest index. */
function bestLastState(delta: Float64Array, T: number, K: number, end: Float64Array | null): number {
  const last = (T - 1) * K;
  let arg = 0;
  let best = delta[last] + (end === null ? 0 : end[0]);
  for (let j = 1; j < K; j++) {
    const s = delta[last + j] + (end === null ? 0 : end[j]);
    if (s > best) {
      best = s;
      arg = j;
    }
  }
  return arg;
}

/**
 * Best last state (ties to the lowest index, end scores included) and the backtrace, recomputing
 * each backpointer as the first i maximising delta[t−1][i] + log P(s_t | i) — the same sums the
 * forward pass maximised, so the path equals the one stored backpointers would give.
 */
function backtrack(params: HmmParams, input: EmissionInput, delta: Float64Array, path: Int32Array): { path: Int32Array; logProbability: number } {
  const K = params.states;
  const T = input.length;
  const { transitions: trans, end } = params;
  const tIndex = input.transitionIndex;
  const KK = K * K;
  let arg = bestLastState(delta, T, K, end);
  const best = delta[(T - 1) * K + arg] + (end === null ? 0 : end[arg]);
  path[T - 1] = arg;
  for (let t = T - 1; t > 0; t--) {
    const prev = (t - 1) * K;
    const m = tIndex === null ? 0 : tIndex[t] * KK;
    let top = delta[prev] + trans[m + arg];
    let from = 0;
    for (let i = 1, a = m + K + arg; i < K; i++, a += K) {
      const s = delta[prev + i] + trans[a];
      if (s > top) {
        top = s;
        from = i;
      }
    }
    arg = from;
    path[t - 1] = arg;
  }
  return { path, logProbability: best };
}
