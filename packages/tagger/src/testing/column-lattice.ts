import type { Rng } from "../util/random";

/**
 * A random column-indexed lattice for the column kernels' tests: a store of random columns
 * (K numbers each, drawn by `draw`), each step t ≥ 1 pointing its K columns at random columns of
 * the store (so steps share columns, as the tagging path's steps share a previous symbol's
 * matrix), and the same steps as row-major matrices (matrix t = step t) for the row-major kernels.
 * With a K×K `mask`, column j of a step is drawn from columns made for position j, whose cells
 * (i, j) with mask 0 hold `forbidden` (−Infinity for log scores, 0 for probabilities).
 */
export function randomColumnLattice(
  rng: Rng,
  K: number,
  T: number,
  pool: number,
  draw: () => number,
  mask: { allowed: Uint8Array; forbidden: number } | null = null,
): { store: Float64Array; columns: Int32Array; matrices: Float64Array; stepIndex: Int32Array } {
  const store = Float64Array.from({ length: pool * K * K }, draw);
  if (mask !== null) {
    for (let p = 0; p < pool; p++) for (let j = 0; j < K; j++) for (let i = 0; i < K; i++) if (mask.allowed[i * K + j] === 0) store[(p * K + j) * K + i] = mask.forbidden;
  }
  const columns = new Int32Array(T * K);
  const matrices = new Float64Array(T * K * K);
  for (let t = 1; t < T; t++) {
    for (let j = 0; j < K; j++) {
      const c = mask === null ? rng.nextInt(pool * K) * K : (rng.nextInt(pool) * K + j) * K;
      columns[t * K + j] = c;
      for (let i = 0; i < K; i++) matrices[t * K * K + i * K + j] = store[c + i];
    }
  }
  return { store, columns, matrices, stepIndex: Int32Array.from({ length: T }, (_, t) => t) };
}

/** A random K×K mask with about `share` of its cells 0, and every cell of column 0 0 when `emptyColumn`. */
export function randomMask(rng: Rng, K: number, share: number, emptyColumn: boolean): Uint8Array {
  const allowed = Uint8Array.from({ length: K * K }, () => (rng.next() < share ? 0 : 1));
  if (emptyColumn) for (let i = 0; i < K; i++) allowed[i * K] = 0;
  return allowed;
}
