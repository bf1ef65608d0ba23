import { describe, expect, it } from "vitest";
import { createRng } from "../util/random";
import { decodeViterbiFloat32 } from "./viterbi-float32";

describe("decodeViterbiFloat32", () => {
  it("finds the best path under float32 sums, ties to the lowest indices from the end (brute force, seeds printed)", () => {
    for (let seed = 1; seed <= 30; seed++) {
      const rng = createRng(seed);
      const K = 2 + rng.nextInt(3);
      const T = 1 + rng.nextInt(5);
      // Coarse values (multiples of 1/4) make exact ties common.
      const draw = () => -Math.floor(rng.next() * 12) / 4;
      const start = Float32Array.from({ length: K }, draw);
      const trans = Float32Array.from({ length: K * K }, draw);
      const em = Float32Array.from({ length: T * K }, draw);
      const path = decodeViterbiFloat32(K, start, trans, em, T);
      let best = -Infinity;
      let bestPath: number[] = [];
      for (let n = 0; n < K ** T; n++) {
        const p: number[] = [];
        let rest = n;
        for (let t = 0; t < T; t++) {
          p.unshift(rest % K);
          rest = Math.floor(rest / K);
        }
        let s = start[p[0]] + em[p[0]];
        for (let t = 1; t < T; t++) s += trans[p[t - 1] * K + p[t]] + em[t * K + p[t]];
        // Viterbi breaks ties at each step toward the lowest predecessor, starting from the lowest
        // last state: among equal scores it returns the path smallest when read from the end.
        const reverseSmaller = () => {
          for (let t = T - 1; t >= 0; t--) if (p[t] !== bestPath[t]) return p[t] < bestPath[t];
          return false;
        };
        if (s > best || (s === best && reverseSmaller())) {
          best = s;
          bestPath = p;
        }
      }
      // Multiples of 1/4 are exact in float32, so brute force in float64 sees the same sums.
      expect(Array.from(path), `seed ${seed}`).toEqual(bestPath);
    }
  });

  it("rounds each sum to float32 (a difference below float32 resolution becomes a tie)", () => {
    // Two states whose scores differ by 1e-9: in float32 they tie and state 0 wins.
    const start = Float32Array.from([-1, -1]);
    const trans = Float32Array.from([-1, -1, -1, -1]);
    const em = new Float32Array([-2, -2 + 1e-9, -2, -2]);
    expect(Array.from(decodeViterbiFloat32(2, start, trans, em, 2))).toEqual([0, 0]);
  });
});
