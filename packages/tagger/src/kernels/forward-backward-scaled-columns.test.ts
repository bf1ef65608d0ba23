import { describe, expect, it } from "vitest";
import { createRng } from "../util/random";
import { expectSameScaledPass } from "../testing/scaled-pass";
import { randomColumnLattice, randomMask } from "../testing/column-lattice";
import { iobConstraints } from "../text/iob-constraints";
import { computeScaledForwardBackward, createScaledWorkspace } from "./forward-backward-scaled";
import { scaledForwardBackwardColumns } from "./forward-backward-scaled-columns";

// The column kernel must reproduce the row-major loop kernel (itself checked against brute-force
// path enumeration in model/sentence-lattice.test.ts) bit for bit over the same probabilities:
// same α̂, ĉ, log-likelihood, and β̂ wherever it computes β̂.
describe("scaledForwardBackwardColumns", () => {
  it("equals computeScaledForwardBackward exactly on random column lattices, compiled (K ≤ 24) and loops (K = 25, 27)", () => {
    const rng = createRng(73);
    for (let trial = 0; trial < 300; trial++) {
      const K = trial < 280 ? 1 + (trial % 13) : trial % 2 === 0 ? 25 : 27;
      const T = 1 + rng.nextInt(25);
      // Probabilities spread over many orders of magnitude, some exactly 0 (forbidden cells).
      const draw = () => (rng.next() < 0.1 ? 0 : Math.exp(-12 * rng.next()));
      const { store, columns, matrices, stepIndex } = randomColumnLattice(rng, K, T, 1 + rng.nextInt(3), draw);
      const start = Float64Array.from({ length: K }, () => 0.05 + rng.next());
      const emissions = Float64Array.from({ length: T * K }, () => 0.01 + Math.exp(-20 * rng.next()));
      const end = trial % 2 === 0 ? null : Float64Array.from({ length: K }, () => 0.01 + rng.next());
      const reference = createScaledWorkspace(K, T);
      const expected = computeScaledForwardBackward(K, T, start, matrices, stepIndex, emissions, end, reference);
      const from = rng.nextInt(T);
      const ws = createScaledWorkspace(K, T + 3);
      const got = scaledForwardBackwardColumns(K, T, start, store, columns, emissions, end, ws, from);
      const label = `trial ${trial} K=${K} T=${T}`;
      expectSameScaledPass(got, expected, ws, reference, K, T, from, label);
    }
  });

  it("gives the same α̂, ĉ, β̂ and log-likelihood bit for bit when told the cells that are 0 at every step (IOB2 masks, random masks, an all-forbidden column)", () => {
    const rng = createRng(75);
    const iob = iobConstraints(["O", "B-PER", "I-PER", "B-LOC", "I-LOC", "B-ORG", "I-ORG", "B-MISC", "I-MISC"]).allowed;
    for (let trial = 0; trial < 200; trial++) {
      const K = trial % 3 === 0 ? 9 : 1 + (trial % 12);
      const allowed = K === 9 && trial % 2 === 0 ? iob : randomMask(rng, K, 0.4, trial % 5 === 1);
      const T = 1 + rng.nextInt(25);
      const draw = () => (rng.next() < 0.1 ? 0 : Math.exp(-12 * rng.next()));
      const { store, columns, matrices, stepIndex } = randomColumnLattice(rng, K, T, 1 + rng.nextInt(3), draw, { allowed, forbidden: 0 });
      const start = Float64Array.from({ length: K }, () => (rng.next() < 0.2 ? 0 : 0.05 + rng.next()));
      const emissions = Float64Array.from({ length: T * K }, () => 0.01 + Math.exp(-20 * rng.next()));
      const end = trial % 2 === 0 ? null : Float64Array.from({ length: K }, () => 0.01 + rng.next());
      const reference = createScaledWorkspace(K, T);
      const expected = computeScaledForwardBackward(K, T, start, matrices, stepIndex, emissions, end, reference);
      const from = rng.nextInt(T);
      const ws = createScaledWorkspace(K, T);
      const got = scaledForwardBackwardColumns(K, T, start, store, columns, emissions, end, ws, from, allowed);
      const label = `trial ${trial} K=${K} T=${T}`;
      expectSameScaledPass(got, expected, ws, reference, K, T, from, label);
    }
  });

  it("returns NaN when the sequence has probability 0 and rejects shapes that do not fit", () => {
    const ws = createScaledWorkspace(2, 2);
    const store = new Float64Array(4).fill(0.5);
    const columns = Int32Array.of(0, 0, 0, 2);
    expect(scaledForwardBackwardColumns(2, 2, Float64Array.of(0.5, 0.5), store, columns, Float64Array.of(1, 1, 0, 0), null, ws, 0)).toBeNaN();
    expect(() => scaledForwardBackwardColumns(2, 2, Float64Array.of(0.5, 0.5), store, Int32Array.of(0, 0, 0, 3), Float64Array.of(1, 1, 1, 1), null, ws, 0)).toThrow(RangeError);
    expect(() => scaledForwardBackwardColumns(2, 3, Float64Array.of(0.5, 0.5), store, new Int32Array(6), new Float64Array(6).fill(1), null, ws, 0)).toThrow(RangeError);
    expect(() => scaledForwardBackwardColumns(2, 2, Float64Array.of(0.5, 0.5), store, columns, Float64Array.of(1, 1, 1, 1), null, ws, 2)).toThrow(RangeError);
    expect(() => scaledForwardBackwardColumns(2, 2, Float64Array.of(0.5, 0.5), store, columns, Float64Array.of(1, 1, 1, 1), null, ws, 0, new Uint8Array(5))).toThrow(RangeError);
  });
});
