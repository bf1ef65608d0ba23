/**
 * The input of the second-order kernels: for each token a list of candidate states (all K, or a
 * pruned subset for large tag sets) with their emission log-scores, and the transition
 * log-probabilities between consecutive candidates laid out block by block:
 *  - `start[a]`            = log P(s_0 = C_0[a] | BOS, BOS)                         (|C_0|)
 *  - `second[a·|C_1| + b]` = log P(s_1 = C_1[b] | BOS, C_0[a])                      (|C_0|×|C_1|)
 *  - block t ≥ 2 at `blockOffsets[t]`: [(a·|C_{t-1}| + b)·|C_t| + c]
 *                          = log P(s_t = C_t[c] | C_{t-2}[a], C_{t-1}[b])           (|C_{t-2}|×|C_{t-1}|×|C_t|)
 *  - `end`: T = 1: log P(EOS | BOS, C_0[a]) (|C_0|); T ≥ 2: [a·|C_{T-1}| + b] =
 *    log P(EOS | C_{T-2}[a], C_{T-1}[b]); null when the model has no end state.
 */
export type SecondOrderLattice = {
  readonly length: number;
  readonly states: number;
  /** T+1 offsets into `candidates` / `emissions`. */
  readonly offsets: Int32Array;
  readonly candidates: Int32Array;
  readonly emissions: Float64Array;
  readonly start: Float64Array;
  readonly second: Float64Array;
  /** T offsets into `blocks` (entries 0 and 1 unused). */
  readonly blockOffsets: Int32Array;
  readonly blocks: Float64Array;
  readonly end: Float64Array | null;
};

/** Throws RangeError naming the first size that disagrees. */
export function checkSecondOrderLattice(lattice: SecondOrderLattice, kernel: string): void {
  const T = lattice.length;
  const { offsets, candidates, emissions, blockOffsets, blocks } = lattice;
  if (!Number.isInteger(T) || T < 0) throw new RangeError(`${kernel}: length must be a non-negative integer, got ${T}`);
  if (offsets.length !== T + 1) throw new RangeError(`${kernel}: offsets has length ${offsets.length}, expected T+1=${T + 1}`);
  if (offsets[0] !== 0 || offsets[T] !== candidates.length) throw new RangeError(`${kernel}: offsets must run from 0 to ${candidates.length} candidates`);
  if (emissions.length !== candidates.length) throw new RangeError(`${kernel}: ${emissions.length} emission scores for ${candidates.length} candidates`);
  const size = (t: number) => offsets[t + 1] - offsets[t];
  for (let t = 0; t < T; t++) {
    if (size(t) < 1) throw new RangeError(`${kernel}: token ${t} has no candidate state`);
  }
  for (let x = 0; x < candidates.length; x++) {
    if (candidates[x] < 0 || candidates[x] >= lattice.states) throw new RangeError(`${kernel}: candidate ${candidates[x]} outside K=${lattice.states}`);
  }
  if (T === 0) return;
  if (lattice.start.length !== size(0)) throw new RangeError(`${kernel}: start has length ${lattice.start.length}, expected |C_0|=${size(0)}`);
  const secondSize = T >= 2 ? size(0) * size(1) : 0;
  if (lattice.second.length !== secondSize) throw new RangeError(`${kernel}: second has length ${lattice.second.length}, expected ${secondSize}`);
  if (blockOffsets.length !== T) throw new RangeError(`${kernel}: blockOffsets has length ${blockOffsets.length}, expected T=${T}`);
  for (let t = 2; t < T; t++) {
    const need = blockOffsets[t] + size(t - 2) * size(t - 1) * size(t);
    if (blockOffsets[t] < 0 || need > blocks.length) throw new RangeError(`${kernel}: block ${t} needs ${need} entries, blocks has ${blocks.length}`);
  }
  if (lattice.end !== null) {
    const endSize = T === 1 ? size(0) : size(T - 2) * size(T - 1);
    if (lattice.end.length !== endSize) throw new RangeError(`${kernel}: end has length ${lattice.end.length}, expected ${endSize}`);
  }
}

/**
 * Where each pair lattice starts: pairOffsets[t] locates the |C_{t-1}|×|C_t| scores of step t
 * (t ≥ 1); pairOffsets[T] is the total size. Length T + 1 (all zeros when T ≤ 1).
 */
export function pairLatticeOffsets(lattice: SecondOrderLattice): Int32Array {
  const { offsets, length: T } = lattice;
  const pairOffsets = new Int32Array(T + 1);
  for (let t = 1; t < T; t++) pairOffsets[t + 1] = pairOffsets[t] + (offsets[t] - offsets[t - 1]) * (offsets[t + 1] - offsets[t]);
  return pairOffsets;
}

/**
 * Scores of the first pair step, the same for the max-product and sum-product passes:
 * out[a·|C_1| + b] = start(a) + e_0(a) + second(a, b) + e_1(b).
 */
export function fillFirstPairStep(lattice: SecondOrderLattice, out: Float64Array): void {
  const { offsets, emissions, start, second } = lattice;
  const n0 = offsets[1] - offsets[0];
  const n1 = offsets[2] - offsets[1];
  for (let a = 0; a < n0; a++) {
    const head = start[a] + emissions[a];
    for (let b = 0; b < n1; b++) out[a * n1 + b] = head + second[a * n1 + b] + emissions[offsets[1] + b];
  }
}
