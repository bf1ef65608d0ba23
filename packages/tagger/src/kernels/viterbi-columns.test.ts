import { describe, expect, it } from "vitest";
import { createRng } from "../util/random";
import { enumeratePaths } from "../testing/hmm-fixtures";
import { randomColumnLattice, randomMask } from "../testing/column-lattice";
import { iobConstraints } from "../text/iob-constraints";
import { createViterbiWorkspace, decodeViterbiJs } from "./viterbi";
import { decodeViterbiColumns } from "./viterbi-columns";

// The column kernel reads each step's scores through K column offsets; over the same scores it
// must give decodeViterbiJs's path and log-probability bit for bit (that kernel is itself held to
// brute-force enumeration in viterbi.test.ts), and brute force directly on small cases.
describe("decodeViterbiColumns", () => {
  it("equals decodeViterbiJs exactly on random column lattices, unrolled (K ≤ 24) and loops (K = 25, 30), ties included", () => {
    const rng = createRng(71);
    for (let trial = 0; trial < 200; trial++) {
      const K = trial < 180 ? 1 + (trial % 13) : trial % 2 === 0 ? 25 : 30;
      const T = 1 + rng.nextInt(20);
      // Scores from a few values only in some trials, so ties occur in the maxima.
      const coarse = trial % 3 === 0;
      const draw = () => (rng.next() < 0.05 ? -Infinity : coarse ? -rng.nextInt(4) : -10 * rng.next());
      const { store, columns, matrices, stepIndex } = randomColumnLattice(rng, K, T, 1 + rng.nextInt(3), draw);
      const start = Float64Array.from({ length: K }, () => (coarse ? -rng.nextInt(3) : -5 * rng.next()));
      const emissions = Float64Array.from({ length: T * K }, () => (coarse ? -rng.nextInt(3) : -20 * rng.next()));
      const end = trial % 2 === 0 ? null : Float64Array.from({ length: K }, () => -3 * rng.next());
      const expected = decodeViterbiJs({ states: K, start, transitions: matrices, end }, { length: T, scores: emissions, rows: null, transitionIndex: stepIndex }, new Int32Array(T));
      const path = new Int32Array(T);
      const got = decodeViterbiColumns(K, T, start, store, columns, emissions, end, path, createViterbiWorkspace(K, T));
      const label = `trial ${trial} K=${K} T=${T}`;
      expect(Object.is(got, expected.logProbability), `${label}: ${got} vs ${expected.logProbability}`).toBe(true);
      expect(Array.from(path), label).toEqual(Array.from(expected.path));
    }
  });

  it("gives the same path and log-probability bit for bit when told the cells that are −Infinity at every step (IOB2 masks, random masks, an all-forbidden column)", () => {
    const rng = createRng(74);
    const iob = iobConstraints(["O", "B-PER", "I-PER", "B-LOC", "I-LOC", "B-ORG", "I-ORG", "B-MISC", "I-MISC"]).allowed;
    for (let trial = 0; trial < 150; trial++) {
      const K = trial % 3 === 0 ? 9 : 1 + (trial % 12);
      const allowed = K === 9 && trial % 2 === 0 ? iob : randomMask(rng, K, 0.4, trial % 5 === 1);
      const T = 1 + rng.nextInt(20);
      const coarse = trial % 4 === 0;
      const draw = () => (coarse ? -rng.nextInt(4) : -10 * rng.next());
      const { store, columns, matrices, stepIndex } = randomColumnLattice(rng, K, T, 1 + rng.nextInt(3), draw, { allowed, forbidden: -Infinity });
      const start = Float64Array.from({ length: K }, () => (rng.next() < 0.2 ? -Infinity : -5 * rng.next()));
      const emissions = Float64Array.from({ length: T * K }, () => (coarse ? -rng.nextInt(3) : -20 * rng.next()));
      const end = trial % 2 === 0 ? null : Float64Array.from({ length: K }, () => -3 * rng.next());
      const expected = decodeViterbiJs({ states: K, start, transitions: matrices, end }, { length: T, scores: emissions, rows: null, transitionIndex: stepIndex }, new Int32Array(T));
      const path = new Int32Array(T);
      const got = decodeViterbiColumns(K, T, start, store, columns, emissions, end, path, createViterbiWorkspace(K, T), allowed);
      const label = `trial ${trial} K=${K} T=${T}`;
      expect(Object.is(got, expected.logProbability), `${label}: ${got} vs ${expected.logProbability}`).toBe(true);
      expect(Array.from(path), label).toEqual(Array.from(expected.path));
    }
  });

  it("finds the best path of brute-force enumeration over all K^T paths (Rabiner 1989 §III-B)", () => {
    const rng = createRng(72);
    for (let trial = 0; trial < 30; trial++) {
      const K = 2 + rng.nextInt(3);
      const T = 1 + rng.nextInt(5);
      const { store, columns, matrices, stepIndex } = randomColumnLattice(rng, K, T, 2, () => -6 * rng.next());
      const start = Float64Array.from({ length: K }, () => -3 * rng.next());
      const emissions = Float64Array.from({ length: T * K }, () => -8 * rng.next());
      const end = trial % 2 === 0 ? null : Float64Array.from({ length: K }, () => -2 * rng.next());
      const brute = enumeratePaths({ states: K, start, transitions: matrices, end }, { length: T, scores: emissions, rows: null, transitionIndex: stepIndex });
      const path = new Int32Array(T);
      const got = decodeViterbiColumns(K, T, start, store, columns, emissions, end, path, createViterbiWorkspace(K, T));
      expect(Array.from(path), `trial ${trial}`).toEqual(Array.from(brute.bestPath));
      expect(got, `trial ${trial}`).toBeCloseTo(brute.bestLogProbability, 10);
    }
  });

  it("rejects shapes that do not fit", () => {
    const ws = createViterbiWorkspace(2, 2);
    const path = new Int32Array(2);
    const start = Float64Array.of(0, 0);
    const scores = new Float64Array(4);
    expect(() => decodeViterbiColumns(2, 2, start, new Float64Array(4), Int32Array.of(0, 0, 0, 3), scores, null, path, ws)).toThrow(RangeError);
    expect(() => decodeViterbiColumns(2, 2, start, new Float64Array(4), Int32Array.of(0, 0, 0), scores, null, path, ws)).toThrow(RangeError);
    expect(() => decodeViterbiColumns(2, 3, start, new Float64Array(4), new Int32Array(6), new Float64Array(6), null, new Int32Array(3), ws)).toThrow(RangeError);
    expect(() => decodeViterbiColumns(2, 2, start, new Float64Array(4), new Int32Array(4), scores, null, new Int32Array(1), ws)).toThrow(RangeError);
    expect(() => decodeViterbiColumns(2, 2, start, new Float64Array(4), new Int32Array(4), scores, null, path, ws, new Uint8Array(3))).toThrow(RangeError);
  });
});
