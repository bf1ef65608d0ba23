import type { Rng } from "../util/random";

/**
 * A random column-indexed lattice for the column kernels' tests: a store of `pool` random
 * columns (K numbers each, drawn by `draw`), each step t ≥ 1 pointing its K columns at random
 * columns of the store (so steps share columns, as the tagging path's steps share a previous
 * symbol's matrix), and the same steps as row-major matrices (matrix t = step t) for the
 * row-major kernels.
 */
export function randomColumnLattice(rng: Rng, K: number, T: number, pool: number, draw: () => number): { store: Float64Array; columns: Int32Array; matrices: Float64Array; stepIndex: Int32Array } {
  const store = Float64Array.from({ length: pool * K }, draw);
  const columns = new Int32Array(T * K);
  const matrices = new Float64Array(T * K * K);
  for (let t = 1; t < T; t++) {
    for (let j = 0; j < K; j++) {
      const c = rng.nextInt(pool) * K;
      columns[t * K + j] = c;
      for (let i = 0; i < K; i++) matrices[t * K * K + i * K + j] = store[c + i];
    }
  }
  return { store, columns, matrices, stepIndex: Int32Array.from({ length: T }, (_, t) => t) };
}
