/**
 * The row-major K×K matrix of step t of a column-indexed lattice (cell (i, j) read from
 * values[columns[t·K + j] + i], see kernels/viterbi-columns.ts), for tests that compare a
 * lattice's steps with the general builder's matrices.
 */
export function stepMatrix(values: Float64Array, columns: Int32Array, t: number, K: number): Float64Array {
  const out = new Float64Array(K * K);
  for (let i = 0; i < K; i++) for (let j = 0; j < K; j++) out[i * K + j] = values[columns[t * K + j] + i];
  return out;
}
