import type { ScaledWorkspace } from "./forward-backward-scaled";

/**
 * {@link computeScaledForwardBackward} compiled for one state count K (the tagging path's
 * kernel): the loops over states are unrolled, the previous token's α̂ and the next token's
 * weighted β̂ live in local variables, and every sum is formed in the same order as in the loop
 * version, so α̂, β̂, ĉ and the log-likelihood are bit for bit the same (see viterbi-unrolled.ts
 * for why unrolling pays in JavaScript).
 *
 * The backward pass can stop early: β̂ is filled for tokens `backwardFrom`..T−1 only, enough for
 * chunk probabilities whose chunks all end at or after `backwardFrom` (span-confidence.ts reads
 * β̂ only right after a chunk).
 *
 * The generated source is built only from integers (K and array offsets), never from input data.
 */
export type UnrolledScaledForwardBackward = (
  length: number,
  start: Float64Array,
  steps: Float64Array,
  stepIndex: Int32Array,
  emissions: Float64Array,
  end: Float64Array | null,
  alpha: Float64Array,
  beta: Float64Array,
  scale: Float64Array,
  backwardFrom: number,
) => number;

/** Largest K compiled this way. */
export const SCALED_UNROLL_LIMIT = 24;

const compiled = new Map<number, UnrolledScaledForwardBackward>();

function generate(K: number): string {
  const KK = K * K;
  const lines: string[] = [];
  const sum = (terms: string[]) => terms.join(" + ");
  lines.push("let sum = 0;");
  for (let j = 0; j < K; j++) lines.push(`let a${j} = start[${j}] * emissions[${j}]; sum += a${j};`);
  lines.push("if (!(sum > 0 && sum < Infinity)) return NaN;");
  lines.push("scale[0] = sum;");
  lines.push("let logLikelihood = Math.log(sum);");
  for (let j = 0; j < K; j++) lines.push(`a${j} /= sum; alpha[${j}] = a${j};`);
  lines.push("for (let t = 1; t < length; t++) {");
  lines.push(`  const m = stepIndex[t] * ${KK};`);
  lines.push(`  const cur = t * ${K};`);
  for (let j = 0; j < K; j++) {
    lines.push(`  const v${j} = (${sum(Array.from({ length: K }, (_, i) => `a${i} * steps[m + ${i * K + j}]`))}) * emissions[cur + ${j}];`);
  }
  // The loop version adds v_j to a running sum starting from 0, in j order.
  lines.push(`  sum = ${sum(Array.from({ length: K }, (_, j) => `v${j}`))};`);
  lines.push("  if (!(sum > 0 && sum < Infinity)) return NaN;");
  lines.push("  scale[t] = sum;");
  lines.push("  logLikelihood += Math.log(sum);");
  lines.push("  const inv = 1 / sum;");
  for (let j = 0; j < K; j++) lines.push(`  a${j} = v${j} * inv; alpha[cur + ${j}] = a${j};`);
  lines.push("}");
  lines.push(`const last = (length - 1) * ${K};`);
  lines.push(`sum = ${sum(Array.from({ length: K }, (_, k) => `a${k} * (end === null ? 1 : end[${k}])`))};`);
  lines.push("if (!(sum > 0 && sum < Infinity)) return NaN;");
  lines.push("scale[length] = sum;");
  lines.push("logLikelihood += Math.log(sum);");
  for (let k = 0; k < K; k++) lines.push(`let b${k} = (end === null ? 1 : end[${k}]) / sum; beta[last + ${k}] = b${k};`);
  lines.push("for (let t = length - 2; t >= backwardFrom; t--) {");
  lines.push(`  const cur = t * ${K};`);
  lines.push(`  const next = cur + ${K};`);
  lines.push(`  const m = stepIndex[t + 1] * ${KK};`);
  lines.push("  const inv = 1 / scale[t + 1];");
  for (let j = 0; j < K; j++) lines.push(`  const w${j} = emissions[next + ${j}] * b${j} * inv;`);
  for (let i = 0; i < K; i++) lines.push(`  b${i} = ${sum(Array.from({ length: K }, (_, j) => `steps[m + ${i * K + j}] * w${j}`))}; beta[cur + ${i}] = b${i};`);
  lines.push("}");
  lines.push("return logLikelihood;");
  return lines.join("\n");
}

/**
 * The compiled kernel for K states (1 ≤ K ≤ SCALED_UNROLL_LIMIT), cached per K. Arguments as in
 * computeScaledForwardBackward plus `backwardFrom`; expects T ≥ 1 and checked shapes
 * ({@link scaledForwardBackwardFrom} checks them).
 */
export function unrolledScaledForwardBackward(K: number): UnrolledScaledForwardBackward {
  if (!Number.isInteger(K) || K < 1 || K > SCALED_UNROLL_LIMIT) throw new RangeError(`unrolledScaledForwardBackward: K=${K} outside 1..${SCALED_UNROLL_LIMIT}`);
  let kernel = compiled.get(K);
  if (kernel === undefined) {
    kernel = new Function("length", "start", "steps", "stepIndex", "emissions", "end", "alpha", "beta", "scale", "backwardFrom", generate(K)) as UnrolledScaledForwardBackward;
    compiled.set(K, kernel);
  }
  return kernel;
}

/**
 * computeScaledForwardBackward's α̂, ĉ and log-likelihood (bit for bit) with β̂ only for tokens
 * backwardFrom..T−1 (0 ≤ backwardFrom ≤ T−1); NaN when a scale factor is 0 or not finite.
 */
export function scaledForwardBackwardFrom(
  K: number,
  T: number,
  start: Float64Array,
  steps: Float64Array,
  stepIndex: Int32Array,
  emissions: Float64Array,
  end: Float64Array | null,
  workspace: ScaledWorkspace,
  backwardFrom: number,
): number {
  const KK = K * K;
  const name = "scaledForwardBackwardFrom";
  if (!Number.isInteger(K) || K < 1 || K > SCALED_UNROLL_LIMIT) throw new RangeError(`${name}: K=${K} outside 1..${SCALED_UNROLL_LIMIT}`);
  if (!Number.isInteger(T) || T < 1) throw new RangeError(`${name}: T=${T}, expected at least 1 token`);
  if (!Number.isInteger(backwardFrom) || backwardFrom < 0 || backwardFrom > T - 1) throw new RangeError(`${name}: backwardFrom=${backwardFrom} outside 0..${T - 1}`);
  if (start.length < K) throw new RangeError(`${name}: start has length ${start.length}, expected K=${K}`);
  if (emissions.length < T * K) throw new RangeError(`${name}: emissions have length ${emissions.length}, expected T×K=${T * K}`);
  if (stepIndex.length < T) throw new RangeError(`${name}: stepIndex has length ${stepIndex.length}, expected T=${T}`);
  for (let t = 1; t < T; t++) {
    const m = stepIndex[t];
    if (!(m >= 0 && (m + 1) * KK <= steps.length)) throw new RangeError(`${name}: stepIndex[${t}]=${m} outside the ${steps.length / KK} matrices`);
  }
  if (end !== null && end.length < K) throw new RangeError(`${name}: end has length ${end.length}, expected K=${K}`);
  const { alpha, beta, scale } = workspace;
  if (alpha.length < T * K || beta.length < T * K || scale.length < T + 1) {
    throw new RangeError(`${name}: workspace holds ${Math.min(alpha.length, beta.length) / K} tokens, sequence has T=${T}`);
  }
  return unrolledScaledForwardBackward(K)(T, start, steps, stepIndex, emissions, end, alpha, beta, scale, backwardFrom);
}
