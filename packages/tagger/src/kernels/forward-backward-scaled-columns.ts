import type { ScaledWorkspace } from "./forward-backward-scaled";
import { kernelKey } from "./viterbi-columns";

/**
 * {@link computeScaledForwardBackward} (Rabiner 1989 §V-A, one scale factor per token) over a
 * lattice whose steps are given column by column: P(j | i) at step t ≥ 1 is
 * steps[columns[t·K + j] + i]. A step whose word overrides a few cells points those columns at
 * patched copies and the others at a shared matrix's columns, so it costs no K×K copy (the
 * tagging path's lattice, model/sentence-lattice.ts).
 *
 * Every sum is formed in the same order as in the row-major kernels (α̂: over i for each j; β̂:
 * over j for each i), so over the same probabilities α̂, β̂, ĉ and the log-likelihood are bit for
 * bit those of computeScaledForwardBackward. Up to COLUMNS_UNROLL_LIMIT states the loops are
 * compiled for K (see forward-backward-scaled-unrolled.ts); beyond it, plain loops.
 *
 * β̂ is filled for tokens backwardFrom..T−1 only (span-confidence.ts reads β̂ only right after a
 * chunk, so the earliest chunk end is enough).
 *
 * With `allowed` (K×K, 0 where a transition is forbidden, as under the IOB2 constraints) the
 * compiled forward pass leaves out the cells that are 0 there. The caller guarantees that every
 * step's probability is exactly 0 in those cells; α̂ is finite and non-negative, so each left-out
 * term is +0 and every partial sum is ≥ +0, and x + 0 = x for such x: the sums are unchanged,
 * bit for bit. The backward pass reads every cell (β̂ is not bounded, and ∞·0 would be NaN).
 *
 * The generated source is built only from integers (K and array offsets), never from input data.
 */
type ColumnsScaled = (
  length: number,
  start: Float64Array,
  steps: Float64Array,
  columns: Int32Array,
  emissions: Float64Array,
  end: Float64Array | null,
  alpha: Float64Array,
  beta: Float64Array,
  scale: Float64Array,
  backwardFrom: number,
) => number;

/** Largest K compiled per K. */
export const COLUMNS_UNROLL_LIMIT = 24;

const compiled = new Map<string, ColumnsScaled>();
/** The kernel of each mask array seen (a model keeps its mask), so a call builds no key string. */
const byMask = new WeakMap<Uint8Array, ColumnsScaled>();
const unmasked: ColumnsScaled[] = [];

function generate(K: number, allowed: Uint8Array | null): string {
  const lines: string[] = [];
  const sum = (terms: string[]) => terms.join(" + ");
  const range = (n: number) => Array.from({ length: n }, (_, x) => x);
  lines.push("let sum = 0;");
  for (let j = 0; j < K; j++) lines.push(`let a${j} = start[${j}] * emissions[${j}]; sum += a${j};`);
  lines.push("if (!(sum > 0 && sum < Infinity)) return NaN;");
  lines.push("scale[0] = sum;");
  lines.push("let logLikelihood = Math.log(sum);");
  for (let j = 0; j < K; j++) lines.push(`a${j} /= sum; alpha[${j}] = a${j};`);
  lines.push("for (let t = 1; t < length; t++) {");
  lines.push(`  const cur = t * ${K};`);
  for (let j = 0; j < K; j++) lines.push(`  const c${j} = columns[cur + ${j}];`);
  for (let j = 0; j < K; j++) {
    const rows = range(K).filter((i) => allowed === null || allowed[i * K + j] !== 0);
    lines.push(`  const v${j} = (${rows.length === 0 ? "0" : sum(rows.map((i) => `a${i} * steps[c${j} + ${i}]`))}) * emissions[cur + ${j}];`);
  }
  // The loop version adds v_j to a running sum starting from 0, in j order.
  lines.push(`  sum = ${sum(range(K).map((j) => `v${j}`))};`);
  lines.push("  if (!(sum > 0 && sum < Infinity)) return NaN;");
  lines.push("  scale[t] = sum;");
  lines.push("  logLikelihood += Math.log(sum);");
  lines.push("  const inv = 1 / sum;");
  for (let j = 0; j < K; j++) lines.push(`  a${j} = v${j} * inv; alpha[cur + ${j}] = a${j};`);
  lines.push("}");
  lines.push(`const last = (length - 1) * ${K};`);
  lines.push(`sum = ${sum(range(K).map((k) => `a${k} * (end === null ? 1 : end[${k}])`))};`);
  lines.push("if (!(sum > 0 && sum < Infinity)) return NaN;");
  lines.push("scale[length] = sum;");
  lines.push("logLikelihood += Math.log(sum);");
  for (let k = 0; k < K; k++) lines.push(`let b${k} = (end === null ? 1 : end[${k}]) / sum; beta[last + ${k}] = b${k};`);
  lines.push("for (let t = length - 2; t >= backwardFrom; t--) {");
  lines.push(`  const cur = t * ${K};`);
  lines.push(`  const next = cur + ${K};`);
  lines.push("  const inv = 1 / scale[t + 1];");
  for (let j = 0; j < K; j++) lines.push(`  const c${j} = columns[next + ${j}];`);
  for (let j = 0; j < K; j++) lines.push(`  const w${j} = emissions[next + ${j}] * b${j} * inv;`);
  for (let i = 0; i < K; i++) lines.push(`  b${i} = ${sum(range(K).map((j) => `steps[c${j} + ${i}] * w${j}`))}; beta[cur + ${i}] = b${i};`);
  lines.push("}");
  lines.push("return logLikelihood;");
  return lines.join("\n");
}

function compiledKernel(K: number, allowed: Uint8Array | null): ColumnsScaled {
  let kernel = allowed === null ? unmasked[K] : byMask.get(allowed);
  if (kernel !== undefined) return kernel;
  const key = kernelKey(K, allowed);
  kernel = compiled.get(key);
  if (kernel === undefined) {
    kernel = new Function("length", "start", "steps", "columns", "emissions", "end", "alpha", "beta", "scale", "backwardFrom", generate(K, allowed)) as ColumnsScaled;
    compiled.set(key, kernel);
  }
  if (allowed === null) unmasked[K] = kernel;
  else byMask.set(allowed, kernel);
  return kernel;
}

/** The loop form of the same passes, for K beyond COLUMNS_UNROLL_LIMIT. */
function loopKernel(
  K: number,
  T: number,
  start: Float64Array,
  steps: Float64Array,
  columns: Int32Array,
  emissions: Float64Array,
  end: Float64Array | null,
  workspace: ScaledWorkspace,
  backwardFrom: number,
): number {
  const { alpha, beta, scale, weighted } = workspace;
  let sum = 0;
  for (let j = 0; j < K; j++) {
    const v = start[j] * emissions[j];
    alpha[j] = v;
    sum += v;
  }
  if (!(sum > 0 && sum < Infinity)) return NaN;
  scale[0] = sum;
  let logLikelihood = Math.log(sum);
  for (let j = 0; j < K; j++) alpha[j] /= sum;
  for (let t = 1; t < T; t++) {
    const prev = (t - 1) * K;
    const cur = t * K;
    sum = 0;
    for (let j = 0; j < K; j++) {
      const c = columns[cur + j];
      let s = 0;
      for (let i = 0; i < K; i++) s += alpha[prev + i] * steps[c + i];
      const v = s * emissions[cur + j];
      alpha[cur + j] = v;
      sum += v;
    }
    if (!(sum > 0 && sum < Infinity)) return NaN;
    scale[t] = sum;
    logLikelihood += Math.log(sum);
    const inv = 1 / sum;
    for (let j = 0; j < K; j++) alpha[cur + j] *= inv;
  }
  const last = (T - 1) * K;
  sum = 0;
  for (let k = 0; k < K; k++) sum += alpha[last + k] * (end === null ? 1 : end[k]);
  if (!(sum > 0 && sum < Infinity)) return NaN;
  scale[T] = sum;
  logLikelihood += Math.log(sum);
  for (let k = 0; k < K; k++) beta[last + k] = (end === null ? 1 : end[k]) / sum;
  for (let t = T - 2; t >= backwardFrom; t--) {
    const cur = t * K;
    const next = (t + 1) * K;
    const inv = 1 / scale[t + 1];
    for (let j = 0; j < K; j++) weighted[j] = emissions[next + j] * beta[next + j] * inv;
    for (let i = 0; i < K; i++) {
      let s = 0;
      for (let j = 0; j < K; j++) s += steps[columns[next + j] + i] * weighted[j];
      beta[cur + i] = s;
    }
  }
  return logLikelihood;
}

/**
 * Fills `workspace` with α̂ and ĉ for tokens 0..T−1 and β̂ for tokens backwardFrom..T−1
 * (0 ≤ backwardFrom ≤ T−1) and returns log P(observations), or NaN when a scale factor is 0 or
 * not finite (the caller then uses the log-space kernels, which do not underflow).
 *
 * @param start K start probabilities; emissions T×K probabilities; end K end probabilities or null.
 * @param steps probabilities, read as steps[columns[t·K + j] + i] = P(j | i) at step t ≥ 1.
 * @param columns T×K column offsets (row 0 unused).
 * @param allowed optional K×K mask: cells that are 0 there hold probability 0 at every step (the
 *   compiled kernel is kept per mask array, which must not change afterwards).
 */
export function scaledForwardBackwardColumns(
  K: number,
  T: number,
  start: Float64Array,
  steps: Float64Array,
  columns: Int32Array,
  emissions: Float64Array,
  end: Float64Array | null,
  workspace: ScaledWorkspace,
  backwardFrom: number,
  allowed: Uint8Array | null = null,
): number {
  const name = "scaledForwardBackwardColumns";
  if (!Number.isInteger(K) || K < 1) throw new RangeError(`${name}: K=${K}, expected a positive integer`);
  if (!Number.isInteger(T) || T < 1) throw new RangeError(`${name}: T=${T}, expected at least 1 token`);
  if (!Number.isInteger(backwardFrom) || backwardFrom < 0 || backwardFrom > T - 1) throw new RangeError(`${name}: backwardFrom=${backwardFrom} outside 0..${T - 1}`);
  if (start.length < K) throw new RangeError(`${name}: start has length ${start.length}, expected K=${K}`);
  if (emissions.length < T * K) throw new RangeError(`${name}: emissions have length ${emissions.length}, expected T×K=${T * K}`);
  if (end !== null && end.length < K) throw new RangeError(`${name}: end has length ${end.length}, expected K=${K}`);
  if (columns.length < T * K) throw new RangeError(`${name}: columns have length ${columns.length}, expected T×K=${T * K}`);
  for (let x = K; x < T * K; x++) {
    const c = columns[x];
    if (!(c >= 0 && c + K <= steps.length)) throw new RangeError(`${name}: column ${x % K} of step ${Math.floor(x / K)} starts at ${c}, outside the ${steps.length} probabilities`);
  }
  if (allowed !== null && allowed.length !== K * K) throw new RangeError(`${name}: allowed has length ${allowed.length}, expected K×K=${K * K}`);
  const { alpha, beta, scale, weighted } = workspace;
  if (alpha.length < T * K || beta.length < T * K || scale.length < T + 1 || weighted.length < K) {
    throw new RangeError(`${name}: workspace holds ${Math.min(alpha.length, beta.length) / K} tokens, sequence has T=${T}`);
  }
  if (K > COLUMNS_UNROLL_LIMIT) return loopKernel(K, T, start, steps, columns, emissions, end, workspace, backwardFrom);
  return compiledKernel(K, allowed)(T, start, steps, columns, emissions, end, alpha, beta, scale, backwardFrom);
}
