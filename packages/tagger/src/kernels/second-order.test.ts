import { describe, expect, it } from "vitest";
import { computePosteriorsSecondOrder } from "./forward-backward-second-order";
import { createRng, type Rng } from "../util/random";
import type { SecondOrderLattice } from "./second-order-lattice";
import { decodeViterbiSecondOrder } from "./viterbi-second-order";

/** A random second-order lattice with random candidate subsets and random log-scores. */
function randomLattice(rng: Rng, K: number, T: number, withEnd: boolean): SecondOrderLattice {
  const cands: number[][] = [];
  for (let t = 0; t < T; t++) {
    const all = Array.from({ length: K }, (_, k) => k).filter(() => rng.next() < 0.7);
    cands.push(all.length > 0 ? all : [rng.nextInt(K)]);
  }
  const offsets = new Int32Array(T + 1);
  cands.forEach((c, t) => (offsets[t + 1] = offsets[t] + c.length));
  const score = () => Math.log(0.05 + rng.next());
  const blockOffsets = new Int32Array(T);
  let total = 0;
  for (let t = 2; t < T; t++) {
    blockOffsets[t] = total;
    total += cands[t - 2].length * cands[t - 1].length * cands[t].length;
  }
  return {
    length: T,
    states: K,
    offsets,
    candidates: Int32Array.from(cands.flat()),
    emissions: Float64Array.from({ length: offsets[T] }, score),
    start: Float64Array.from({ length: T > 0 ? cands[0].length : 0 }, score),
    second: Float64Array.from({ length: T >= 2 ? cands[0].length * cands[1].length : 0 }, score),
    blockOffsets,
    blocks: Float64Array.from({ length: total }, score),
    end: withEnd ? Float64Array.from({ length: T === 1 ? cands[0].length : cands[T - 2].length * cands[T - 1].length }, score) : null,
  };
}

/** All candidate paths with their scores, straight from the block definitions. */
function enumerate(l: SecondOrderLattice) {
  const T = l.length;
  const size = (t: number) => l.offsets[t + 1] - l.offsets[t];
  const results: { path: number[]; score: number }[] = [];
  const idx = new Array<number>(T).fill(0);
  for (;;) {
    let s = l.start[idx[0]] + l.emissions[idx[0]];
    if (T >= 2) s += l.second[idx[0] * size(1) + idx[1]] + l.emissions[l.offsets[1] + idx[1]];
    for (let t = 2; t < T; t++) s += l.blocks[l.blockOffsets[t] + (idx[t - 2] * size(t - 1) + idx[t - 1]) * size(t) + idx[t]] + l.emissions[l.offsets[t] + idx[t]];
    if (l.end !== null) s += T === 1 ? l.end[idx[0]] : l.end[idx[T - 2] * size(T - 1) + idx[T - 1]];
    results.push({ path: idx.map((c, t) => l.candidates[l.offsets[t] + c]), score: s });
    let t = T - 1;
    while (t >= 0 && ++idx[t] === size(t)) idx[t--] = 0;
    if (t < 0) break;
  }
  return results;
}

describe("second-order kernels", () => {
  it("Viterbi, likelihood and posteriors equal brute-force enumeration (seeds printed on failure)", () => {
    for (let seed = 1; seed <= 40; seed++) {
      const rng = createRng(seed);
      const K = 2 + rng.nextInt(3);
      const T = 1 + rng.nextInt(5);
      const lattice = randomLattice(rng, K, T, rng.next() < 0.5);
      const all = enumerate(lattice);
      let best = all[0];
      for (const r of all) if (r.score > best.score) best = r;
      const max = Math.max(...all.map((r) => r.score));
      const logZ = max + Math.log(all.reduce((acc, r) => acc + Math.exp(r.score - max), 0));
      const v = decodeViterbiSecondOrder(lattice);
      expect(Array.from(v.path), `seed ${seed}`).toEqual(best.path);
      expect(v.logProbability, `seed ${seed}`).toBeCloseTo(best.score, 10);
      const { posteriors, logLikelihood } = computePosteriorsSecondOrder(lattice);
      expect(logLikelihood, `seed ${seed}`).toBeCloseTo(logZ, 10);
      const expected = new Float64Array(T * K);
      for (const r of all) r.path.forEach((k, t) => (expected[t * K + k] += Math.exp(r.score - logZ)));
      expected.forEach((p, x) => expect(posteriors[x], `seed ${seed} cell ${x}`).toBeCloseTo(p, 10));
      for (let t = 0; t < T; t++) {
        let sum = 0;
        for (let k = 0; k < K; k++) sum += posteriors[t * K + k];
        expect(sum, `seed ${seed} t ${t}`).toBeCloseTo(1, 12);
      }
    }
  });

  it("rejects inconsistent lattices with a RangeError naming sizes", () => {
    const lattice = randomLattice(createRng(3), 3, 3, true);
    expect(() => decodeViterbiSecondOrder({ ...lattice, start: new Float64Array(99) })).toThrow(/start has length 99/);
    expect(() => computePosteriorsSecondOrder({ ...lattice, end: new Float64Array(1) })).toThrow(/end has length 1/);
  });
});
