/**
 * Log-space arithmetic shared by every kernel. The whole package works with natural-log
 * probabilities; this is the one place that adds probabilities held as logarithms.
 */

/** log(exp(a) + exp(b)), exact for -Infinity operands. */
export function logAddExp(a: number, b: number): number {
  if (a === -Infinity) return b;
  if (b === -Infinity) return a;
  // Factor out the larger term so exp never overflows and the small one loses no precision.
  return a > b ? a + Math.log1p(Math.exp(b - a)) : b + Math.log1p(Math.exp(a - b));
}

/**
 * log(Σ exp(values[offset + i*stride])) for i in [0, count). Returns -Infinity for an empty
 * range or when every term is -Infinity.
 */
export function logSumExp(values: ArrayLike<number>, offset = 0, count = values.length - offset, stride = 1): number {
  let max = -Infinity;
  for (let i = 0, p = offset; i < count; i++, p += stride) {
    const v = values[p];
    if (v > max) max = v;
  }
  if (max === -Infinity || max === Infinity) return max;
  let sum = 0;
  for (let i = 0, p = offset; i < count; i++, p += stride) sum += Math.exp(values[p] - max);
  return max + Math.log(sum);
}

/** Natural log of a probability, mapping 0 to -Infinity explicitly (Math.log already does). */
export function safeLog(p: number): number {
  return p > 0 ? Math.log(p) : -Infinity;
}
