import { describe, expect, it } from "vitest";
import { createRng } from "../util/random";
import { expectSameScaledPass } from "../testing/scaled-pass";
import { computeScaledForwardBackward, createScaledWorkspace } from "./forward-backward-scaled";
import { scaledForwardBackwardFrom } from "./forward-backward-scaled-unrolled";

// The compiled kernel must reproduce the loop kernel (itself checked against brute-force path
// enumeration in model/sentence-lattice.test.ts) bit for bit: same α̂, ĉ, log-likelihood, and β̂
// wherever it computes β̂.
describe("scaledForwardBackwardFrom", () => {
  it("equals computeScaledForwardBackward exactly on random lattices, K = 1..13, with and without an end state", () => {
    const rng = createRng(53);
    for (let trial = 0; trial < 300; trial++) {
      const K = 1 + (trial % 13);
      const T = 1 + rng.nextInt(25);
      const M = 1 + rng.nextInt(5);
      // Probabilities spread over many orders of magnitude, some exactly 0 (forbidden cells).
      const draw = () => (rng.next() < 0.1 ? 0 : Math.exp(-12 * rng.next()));
      const steps = Float64Array.from({ length: M * K * K }, draw);
      const stepIndex = Int32Array.from({ length: T }, () => rng.nextInt(M));
      const start = Float64Array.from({ length: K }, () => 0.05 + rng.next());
      const emissions = Float64Array.from({ length: T * K }, () => 0.01 + Math.exp(-20 * rng.next()));
      const end = trial % 2 === 0 ? null : Float64Array.from({ length: K }, () => 0.01 + rng.next());
      const reference = createScaledWorkspace(K, T);
      const expected = computeScaledForwardBackward(K, T, start, steps, stepIndex, emissions, end, reference);
      const from = rng.nextInt(T);
      const ws = createScaledWorkspace(K, T + 3);
      const got = scaledForwardBackwardFrom(K, T, start, steps, stepIndex, emissions, end, ws, from);
      const label = `trial ${trial} K=${K} T=${T}`;
      expectSameScaledPass(got, expected, ws, reference, K, T, from, label);
    }
  });

  it("returns NaN when the sequence has probability 0 and rejects shapes that do not fit", () => {
    const ws = createScaledWorkspace(2, 2);
    const steps = new Float64Array(8).fill(0.5);
    const index = Int32Array.of(0, 1);
    expect(scaledForwardBackwardFrom(2, 2, Float64Array.of(0.5, 0.5), steps, index, Float64Array.of(1, 1, 0, 0), null, ws, 0)).toBeNaN();
    expect(() => scaledForwardBackwardFrom(2, 2, Float64Array.of(0.5, 0.5), steps, Int32Array.of(0, 2), Float64Array.of(1, 1, 1, 1), null, ws, 0)).toThrow(RangeError);
    expect(() => scaledForwardBackwardFrom(2, 3, Float64Array.of(0.5, 0.5), steps, Int32Array.of(0, 1, 1), new Float64Array(6).fill(1), null, ws, 0)).toThrow(RangeError);
    expect(() => scaledForwardBackwardFrom(2, 2, Float64Array.of(0.5, 0.5), steps, index, Float64Array.of(1, 1, 1, 1), null, ws, 2)).toThrow(RangeError);
  });
});
