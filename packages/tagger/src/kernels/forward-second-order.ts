import { logSumExp } from "../util/math";
import { checkSecondOrderLattice, fillFirstPairStep, pairLatticeOffsets, type SecondOrderLattice } from "./second-order-lattice";

/**
 * Forward pass of a second-order HMM over a candidate lattice (pair states; Rabiner 1989 §III-A
 * on the chain of tag pairs), in log space: alpha_t(b, c) = log P(o_0..o_t, s_{t-1} = C_{t-1}[b],
 * s_t = C_t[c]) for t ≥ 1, stored at pairOffsets[t]. Returns log P(O) (−Infinity when impossible),
 * over the lattice: with pruned candidates it is the likelihood of the pruned model.
 */
export function computeForwardSecondOrder(lattice: SecondOrderLattice): { alpha: Float64Array; pairOffsets: Int32Array; logLikelihood: number } {
  checkSecondOrderLattice(lattice, "computeForwardSecondOrder");
  const T = lattice.length;
  const { offsets, emissions, start, blockOffsets, blocks, end } = lattice;
  const size = (t: number) => offsets[t + 1] - offsets[t];
  const pairOffsets = pairLatticeOffsets(lattice);
  if (T === 0) return { alpha: new Float64Array(0), pairOffsets, logLikelihood: 0 };
  const n0 = size(0);
  let widest = 0;
  for (let t = 0; t < T; t++) widest = Math.max(widest, size(t));
  const terms = new Float64Array(Math.max(widest * widest, 1));
  if (T === 1) {
    for (let a = 0; a < n0; a++) terms[a] = start[a] + emissions[a] + (end === null ? 0 : end[a]);
    return { alpha: new Float64Array(0), pairOffsets, logLikelihood: logSumExp(terms, 0, n0) };
  }
  const alpha = new Float64Array(pairOffsets[T]);
  fillFirstPairStep(lattice, alpha);
  for (let t = 2; t < T; t++) {
    const nA = size(t - 2);
    const nB = size(t - 1);
    const nC = size(t);
    const prev = pairOffsets[t - 1];
    const cur = pairOffsets[t];
    const block = blockOffsets[t];
    for (let b = 0; b < nB; b++) {
      for (let c = 0; c < nC; c++) {
        for (let a = 0; a < nA; a++) terms[a] = alpha[prev + a * nB + b] + blocks[block + (a * nB + b) * nC + c];
        alpha[cur + b * nC + c] = logSumExp(terms, 0, nA) + emissions[offsets[t] + c];
      }
    }
  }
  const last = pairOffsets[T - 1];
  const count = size(T - 2) * size(T - 1);
  for (let x = 0; x < count; x++) terms[x] = alpha[last + x] + (end === null ? 0 : end[x]);
  return { alpha, pairOffsets, logLikelihood: logSumExp(terms, 0, count) };
}
