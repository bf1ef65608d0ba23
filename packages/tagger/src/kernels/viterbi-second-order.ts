import { checkSecondOrderLattice, fillFirstPairStep, pairLatticeOffsets, type SecondOrderLattice } from "./second-order-lattice";

/**
 * Viterbi for a second-order HMM (the trigram tagger of Brants 2000 §2; states are pairs of
 * consecutive tags) over a candidate lattice, in log space. delta_t(b, c) is the best score of a
 * path ending with C_{t-1}[b], C_t[c]; cost Σ_t |C_{t-2}|·|C_{t-1}|·|C_t|. Ties go to the
 * lowest candidate index. Returns state ids (not candidate indices) and the path's joint
 * log-probability.
 */
export function decodeViterbiSecondOrder(lattice: SecondOrderLattice, out?: Int32Array): { path: Int32Array; logProbability: number } {
  checkSecondOrderLattice(lattice, "decodeViterbiSecondOrder");
  const T = lattice.length;
  const path = out ?? new Int32Array(T);
  if (path.length < T) throw new RangeError(`decodeViterbiSecondOrder: out has length ${path.length}, expected T=${T}`);
  if (T === 0) return { path, logProbability: 0 };
  const { offsets, candidates, emissions, start, blockOffsets, blocks, end } = lattice;
  const size = (t: number) => offsets[t + 1] - offsets[t];
  const n0 = size(0);
  if (T === 1) {
    let best = -Infinity;
    let arg = 0;
    for (let a = 0; a < n0; a++) {
      const s = start[a] + emissions[a] + (end === null ? 0 : end[a]);
      if (s > best) {
        best = s;
        arg = a;
      }
    }
    path[0] = candidates[arg];
    return { path, logProbability: best };
  }
  // Pair lattices: pairOffsets[t] locates delta_t (|C_{t-1}|×|C_t|) for t ≥ 1.
  const pairOffsets = pairLatticeOffsets(lattice);
  const delta = new Float64Array(pairOffsets[T]);
  const back = new Int32Array(pairOffsets[T]);
  fillFirstPairStep(lattice, delta);
  for (let t = 2; t < T; t++) {
    const nA = size(t - 2);
    const nB = size(t - 1);
    const nC = size(t);
    const prev = pairOffsets[t - 1];
    const cur = pairOffsets[t];
    const block = blockOffsets[t];
    const e = offsets[t];
    for (let b = 0; b < nB; b++) {
      for (let c = 0; c < nC; c++) {
        let best = -Infinity;
        let arg = 0;
        for (let a = 0; a < nA; a++) {
          const s = delta[prev + a * nB + b] + blocks[block + (a * nB + b) * nC + c];
          if (s > best) {
            best = s;
            arg = a;
          }
        }
        delta[cur + b * nC + c] = best + emissions[e + c];
        back[cur + b * nC + c] = arg;
      }
    }
  }
  const nA = size(T - 2);
  const nB = size(T - 1);
  const last = pairOffsets[T - 1];
  let best = -Infinity;
  let argA = 0;
  let argB = 0;
  for (let a = 0; a < nA; a++) {
    for (let b = 0; b < nB; b++) {
      const s = delta[last + a * nB + b] + (end === null ? 0 : end[a * nB + b]);
      if (s > best) {
        best = s;
        argA = a;
        argB = b;
      }
    }
  }
  path[T - 1] = candidates[offsets[T - 1] + argB];
  path[T - 2] = candidates[offsets[T - 2] + argA];
  let b = argA;
  let c = argB;
  for (let t = T - 1; t >= 2; t--) {
    const a = back[pairOffsets[t] + b * size(t) + c];
    path[t - 2] = candidates[offsets[t - 2] + a];
    c = b;
    b = a;
  }
  return { path, logProbability: best };
}
