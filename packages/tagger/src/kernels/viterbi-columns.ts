import type { ViterbiWorkspace } from "./viterbi";
import { UNROLL_LIMIT } from "./viterbi-unrolled";

/**
 * Viterbi (the max-product recursion of {@link decodeViterbi}, Rabiner 1989 §III-B, log space)
 * over a lattice whose steps are given column by column: the log score of moving from state i to
 * state j at step t (t ≥ 1) is transitions[columns[t·K + j] + i]. A step whose word overrides a
 * few cells then points those columns at patched copies and the others at a shared matrix's
 * columns, so no step needs a K×K copy of its own (the tagging path's lattice,
 * model/sentence-lattice.ts).
 *
 * Same sums and ties as decodeViterbiJs (ties to the lowest state index, in the recursion and at
 * the last token): over the same scores it gives the same path and log-probability, bit for bit.
 * Up to UNROLL_LIMIT states the recursion is compiled for K (see viterbi-unrolled.ts: the maxima
 * in local variables, argmaxes recovered in the backtrace by repeating the same sums); beyond it,
 * plain loops with stored backpointers.
 *
 * With `allowed` (K×K, 0 where a transition is forbidden, as under the IOB2 constraints) the
 * compiled recursion leaves out the cells that are 0 there. The caller guarantees that every
 * step's score is −Infinity in those cells; Math.max(b, d + −Infinity) is b for every b that
 * is not NaN (and the recursion's d are never +Infinity), so the maxima are unchanged, bit for bit.
 * The backtrace still reads every cell.
 *
 * The generated source is built only from integers (K and array offsets), never from input data.
 */
type ColumnsForward = (length: number, start: Float64Array, transitions: Float64Array, columns: Int32Array, emissions: Float64Array, delta: Float64Array) => void;

const compiled = new Map<string, ColumnsForward>();
/** The kernel of each mask array seen (a model keeps its mask), so a call builds no key string. */
const byMask = new WeakMap<Uint8Array, ColumnsForward>();
const unmasked: ColumnsForward[] = [];

/** A key of (K, mask) for sharing compiled kernels between equal masks. */
export function kernelKey(K: number, allowed: Uint8Array | null): string {
  return `${K}:${allowed === null ? "" : Array.from(allowed, (a) => (a === 0 ? "0" : "1")).join("")}`;
}

function generate(K: number, allowed: Uint8Array | null): string {
  const lines: string[] = [];
  const rowsOf = (j: number) => Array.from({ length: K }, (_, i) => i).filter((i) => allowed === null || allowed[i * K + j] !== 0);
  for (let j = 0; j < K; j++) lines.push(`let d${j} = start[${j}] + emissions[${j}]; delta[${j}] = d${j};`);
  lines.push("for (let t = 1; t < length; t++) {");
  lines.push(`  const base = t * ${K};`);
  for (let j = 0; j < K; j++) lines.push(`  const c${j} = columns[base + ${j}];`);
  for (let j = 0; j < K; j++) {
    const rows = rowsOf(j);
    if (rows.length === 0) {
      lines.push(`  const b${j} = -Infinity;`);
      continue;
    }
    lines.push(`  let b${j} = d${rows[0]} + transitions[c${j} + ${rows[0]}];`);
    for (const i of rows.slice(1)) lines.push(`  b${j} = Math.max(b${j}, d${i} + transitions[c${j} + ${i}]);`);
  }
  for (let j = 0; j < K; j++) lines.push(`  d${j} = b${j} + emissions[base + ${j}]; delta[base + ${j}] = d${j};`);
  lines.push("}");
  return lines.join("\n");
}

function compiledForward(K: number, allowed: Uint8Array | null): ColumnsForward {
  let kernel = allowed === null ? unmasked[K] : byMask.get(allowed);
  if (kernel !== undefined) return kernel;
  const key = kernelKey(K, allowed);
  kernel = compiled.get(key);
  if (kernel === undefined) {
    kernel = new Function("length", "start", "transitions", "columns", "emissions", "delta", generate(K, allowed)) as ColumnsForward;
    compiled.set(key, kernel);
  }
  if (allowed === null) unmasked[K] = kernel;
  else byMask.set(allowed, kernel);
  return kernel;
}

/**
 * Most probable state path over a column-indexed lattice.
 *
 * @param start K start log scores; emissions T×K log scores; end K log end scores or null.
 * @param transitions log scores, read as transitions[columns[t·K + j] + i] for step t ≥ 1.
 * @param columns T×K column offsets (row 0 unused).
 * @param path receives the T states; workspace holds at least T×K numbers.
 * @param allowed optional K×K mask: cells that are 0 there hold −Infinity at every step (the
 *   compiled kernel is kept per mask array, which must not change afterwards).
 * @returns log P(path, observations).
 */
export function decodeViterbiColumns(
  K: number,
  T: number,
  start: Float64Array,
  transitions: Float64Array,
  columns: Int32Array,
  emissions: Float64Array,
  end: Float64Array | null,
  path: Int32Array,
  workspace: ViterbiWorkspace,
  allowed: Uint8Array | null = null,
): number {
  const name = "decodeViterbiColumns";
  if (!Number.isInteger(K) || K < 1) throw new RangeError(`${name}: K=${K}, expected a positive integer`);
  if (!Number.isInteger(T) || T < 1) throw new RangeError(`${name}: T=${T}, expected at least 1 token`);
  if (start.length < K) throw new RangeError(`${name}: start has length ${start.length}, expected K=${K}`);
  if (emissions.length < T * K) throw new RangeError(`${name}: emissions have length ${emissions.length}, expected T×K=${T * K}`);
  if (end !== null && end.length < K) throw new RangeError(`${name}: end has length ${end.length}, expected K=${K}`);
  if (columns.length < T * K) throw new RangeError(`${name}: columns have length ${columns.length}, expected T×K=${T * K}`);
  for (let x = K; x < T * K; x++) {
    const c = columns[x];
    if (!(c >= 0 && c + K <= transitions.length)) throw new RangeError(`${name}: column ${x % K} of step ${Math.floor(x / K)} starts at ${c}, outside the ${transitions.length} scores`);
  }
  if (path.length < T) throw new RangeError(`${name}: path has length ${path.length}, expected T=${T}`);
  if (allowed !== null && allowed.length !== K * K) throw new RangeError(`${name}: allowed has length ${allowed.length}, expected K×K=${K * K}`);
  const { delta, backpointers: bp } = workspace;
  if (delta.length < T * K || bp.length < T * K) throw new RangeError(`${name}: workspace holds ${delta.length / K} tokens, sequence has T=${T}`);
  if (K <= UNROLL_LIMIT) {
    compiledForward(K, allowed)(T, start, transitions, columns, emissions, delta);
    let arg = bestLast(delta, T, K, end);
    const best = delta[(T - 1) * K + arg] + (end === null ? 0 : end[arg]);
    path[T - 1] = arg;
    // The first i maximising delta[t−1][i] + score(i → arg): the sums the recursion maximised.
    for (let t = T - 1; t > 0; t--) {
      const prev = (t - 1) * K;
      const c = columns[t * K + arg];
      let top = delta[prev] + transitions[c];
      let from = 0;
      for (let i = 1; i < K; i++) {
        const s = delta[prev + i] + transitions[c + i];
        if (s > top) {
          top = s;
          from = i;
        }
      }
      arg = from;
      path[t - 1] = arg;
    }
    return best;
  }
  for (let j = 0; j < K; j++) delta[j] = start[j] + emissions[j];
  for (let t = 1; t < T; t++) {
    const prev = (t - 1) * K;
    const cur = t * K;
    for (let j = 0; j < K; j++) {
      const c = columns[cur + j];
      let best = delta[prev] + transitions[c];
      let arg = 0;
      for (let i = 1; i < K; i++) {
        const s = delta[prev + i] + transitions[c + i];
        if (s > best) {
          best = s;
          arg = i;
        }
      }
      delta[cur + j] = best + emissions[cur + j];
      bp[cur + j] = arg;
    }
  }
  let arg = bestLast(delta, T, K, end);
  const best = delta[(T - 1) * K + arg] + (end === null ? 0 : end[arg]);
  path[T - 1] = arg;
  for (let t = T - 1; t > 0; t--) {
    arg = bp[t * K + arg];
    path[t - 1] = arg;
  }
  return best;
}

/** The best state at the last token (end scores included), ties to the lowest index. */
function bestLast(delta: Float64Array, T: number, K: number, end: Float64Array | null): number {
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
