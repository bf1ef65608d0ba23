import { computeForwardSecondOrder } from "./forward-second-order";
import { logSumExp } from "../util/math";
import { checkSecondOrderLattice, type SecondOrderLattice } from "./second-order-lattice";

/**
 * Forward-backward for a second-order HMM over a candidate lattice (pair states, log space; the
 * recursions of Rabiner 1989 §III on the pair chain). Returns per-token posterior marginals as a
 * dense T×K table of probabilities (0 for states that were not candidates) and log P(O) over the
 * lattice. Throws RangeError when the observations have probability 0.
 */
export function computePosteriorsSecondOrder(lattice: SecondOrderLattice): { posteriors: Float64Array; logLikelihood: number } {
  checkSecondOrderLattice(lattice, "computePosteriorsSecondOrder");
  const T = lattice.length;
  const K = lattice.states;
  const posteriors = new Float64Array(T * K);
  if (T === 0) return { posteriors, logLikelihood: 0 };
  const { offsets, candidates, emissions, start, blockOffsets, blocks, end } = lattice;
  const { alpha, pairOffsets, logLikelihood } = computeForwardSecondOrder(lattice);
  if (logLikelihood === -Infinity) throw new RangeError("computePosteriorsSecondOrder: the observations have probability 0 under the model");
  const size = (t: number) => offsets[t + 1] - offsets[t];
  const n0 = size(0);
  if (T === 1) {
    for (let a = 0; a < n0; a++) posteriors[candidates[a]] += Math.exp(start[a] + emissions[a] + (end === null ? 0 : end[a]) - logLikelihood);
    return { posteriors, logLikelihood };
  }
  let widest = 0;
  for (let t = 0; t < T; t++) widest = Math.max(widest, size(t));
  const terms = new Float64Array(widest);
  const n1 = size(1);
  const beta = new Float64Array(pairOffsets[T]);
  const last = pairOffsets[T - 1];
  for (let x = 0; x < size(T - 2) * size(T - 1); x++) beta[last + x] = end === null ? 0 : end[x];
  for (let t = T - 1; t >= 2; t--) {
    const nA = size(t - 2);
    const nB = size(t - 1);
    const nC = size(t);
    const prev = pairOffsets[t - 1];
    const cur = pairOffsets[t];
    const block = blockOffsets[t];
    for (let a = 0; a < nA; a++) {
      for (let b = 0; b < nB; b++) {
        for (let c = 0; c < nC; c++) terms[c] = blocks[block + (a * nB + b) * nC + c] + emissions[offsets[t] + c] + beta[cur + b * nC + c];
        beta[prev + a * nB + b] = logSumExp(terms, 0, nC);
      }
    }
  }
  for (let a = 0; a < n0; a++) {
    for (let b = 0; b < n1; b++) {
      const w = Math.exp(alpha[a * n1 + b] + beta[a * n1 + b] - logLikelihood);
      posteriors[candidates[a]] += w;
      posteriors[K + candidates[offsets[1] + b]] += w;
    }
  }
  for (let t = 2; t < T; t++) {
    const nB = size(t - 1);
    const nC = size(t);
    const cur = pairOffsets[t];
    for (let b = 0; b < nB; b++) {
      for (let c = 0; c < nC; c++) posteriors[t * K + candidates[offsets[t] + c]] += Math.exp(alpha[cur + b * nC + c] + beta[cur + b * nC + c] - logLikelihood);
    }
  }
  return { posteriors, logLikelihood };
}
