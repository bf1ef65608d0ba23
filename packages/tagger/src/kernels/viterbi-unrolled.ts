/**
 * The max-product recursion of {@link decodeViterbi} compiled for one state count K: loops over
 * states are fully unrolled, scores live in local variables, and a single transition matrix is
 * read once per sentence. JavaScript engines do not hoist the per-iteration checks of typed-array
 * loops over small K (each step of an inner loop re-validates its arrays), so the plain loops run
 * several times slower than the same recursion in C; with everything unrolled the engine compiles
 * straight-line code, like a C compiler given a constant K.
 *
 * The generated source is built only from integers (K and array offsets), never from input data.
 * Only the maximum is computed here (Math.max); the caller recovers each argmax during the
 * backtrace, which is exact because it repeats the same floating-point sums.
 */
export type UnrolledForward = (
  length: number,
  start: Float64Array,
  transitions: Float64Array,
  emissions: Float64Array,
  rows: Int32Array | null,
  transitionIndex: Int32Array | null,
  delta: Float64Array,
) => void;

/** Largest K compiled this way; beyond it the code would be too large to pay off. */
export const UNROLL_LIMIT = 24;

const compiled = new Map<string, UnrolledForward>();

function generate(K: number, shared: boolean): string {
  const KK = K * K;
  const lines: string[] = [];
  if (shared) for (let x = 0; x < KK; x++) lines.push(`const a${x} = transitions[${x}];`);
  lines.push("let e = (rows === null ? 0 : rows[0]) * " + K + ";");
  for (let j = 0; j < K; j++) lines.push(`let d${j} = start[${j}] + emissions[e + ${j}]; delta[${j}] = d${j};`);
  lines.push("for (let t = 1; t < length; t++) {");
  lines.push(`  e = (rows === null ? t : rows[t]) * ${K};`);
  if (!shared) lines.push(`  const m = (transitionIndex === null ? 0 : transitionIndex[t]) * ${KK};`);
  const a = (i: number, j: number) => (shared ? `a${i * K + j}` : `transitions[m + ${i * K + j}]`);
  for (let j = 0; j < K; j++) {
    lines.push(`  let b${j} = d0 + ${a(0, j)};`);
    for (let i = 1; i < K; i++) lines.push(`  b${j} = Math.max(b${j}, d${i} + ${a(i, j)});`);
  }
  lines.push(`  const base = t * ${K};`);
  for (let j = 0; j < K; j++) lines.push(`  d${j} = b${j} + emissions[e + ${j}]; delta[base + ${j}] = d${j};`);
  lines.push("}");
  return lines.join("\n");
}

/**
 * The compiled forward recursion for K states (1 ≤ K ≤ UNROLL_LIMIT); `shared` when all steps use
 * transition matrix 0. Fills delta (T×K) exactly as the loop version would. Cached per (K, shared).
 */
export function unrolledForward(K: number, shared: boolean): UnrolledForward {
  if (!Number.isInteger(K) || K < 1 || K > UNROLL_LIMIT) throw new RangeError(`unrolledForward: K=${K} outside 1..${UNROLL_LIMIT}`);
  const key = `${K}:${shared ? "shared" : "indexed"}`;
  let kernel = compiled.get(key);
  if (kernel === undefined) {
    kernel = new Function("length", "start", "transitions", "emissions", "rows", "transitionIndex", "delta", generate(K, shared)) as UnrolledForward;
    compiled.set(key, kernel);
  }
  return kernel;
}
