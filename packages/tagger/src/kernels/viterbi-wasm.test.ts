import { describe, expect, it } from "vitest";
import type { EmissionInput, HmmParams } from "./hmm-params";
import { iobConstraints } from "../text/iob-constraints";
import { createRng, type Rng } from "../util/random";
import { enumeratePaths, randomHmm } from "../testing/hmm-fixtures";
import { createViterbiWorkspace, decodeViterbi, decodeViterbiJs } from "./viterbi";
import { UNROLL_LIMIT } from "./viterbi-unrolled";
import { WASM_STATE_LIMIT, decodeViterbiWasm, isWasmSimdAvailable } from "./viterbi-wasm";

/** O, B-T0, I-T0, B-T1, … truncated to K tags. */
function iobTags(K: number): string[] {
  const tags = ["O"];
  for (let x = 0; tags.length < K; x++) tags.push(`B-T${x}`, `I-T${x}`);
  return tags.slice(0, K);
}

/**
 * A random model with IOB2 constraints as -Infinity (forbidden starts and transitions in every
 * matrix), a few -Infinity emission scores, and symbol V−1 impossible in every state, so that a
 * sequence containing it has no possible path from there on.
 */
function constrainedModel(rng: Rng, K: number, V: number, matrices: number, end: boolean): { params: HmmParams; emissionTable: Float64Array } {
  const { params, emissionTable } = randomHmm(rng, K, V, { matrices, end });
  const { allowed, allowedStart } = iobConstraints(iobTags(K));
  const start = params.start.slice();
  const transitions = params.transitions.slice();
  for (let j = 0; j < K; j++) if (allowedStart[j] === 0) start[j] = -Infinity;
  for (let m = 0; m < matrices; m++) for (let x = 0; x < K * K; x++) if (allowed[x] === 0) transitions[m * K * K + x] = -Infinity;
  for (let x = 0; x < emissionTable.length; x++) if (rng.next() < 0.03) emissionTable[x] = -Infinity;
  emissionTable.fill(-Infinity, (V - 1) * K);
  return { params: { ...params, start, transitions }, emissionTable };
}

/** Index of the first entry among the first n whose bit patterns differ, or −1. */
function firstBitDifference(a: Float64Array, b: Float64Array, n: number): number {
  const x = new BigUint64Array(a.buffer, a.byteOffset, n);
  const y = new BigUint64Array(b.buffer, b.byteOffset, n);
  for (let q = 0; q < n; q++) if (x[q] !== y[q]) return q;
  return -1;
}

/**
 * Gather input (in a quarter of the sequences, symbol V−1 at one token: no possible path) with a random transition index over the
 * M matrices, or its dense copy (T×K, or with two spare rows at the end half of the time).
 */
function randomInput(rng: Rng, K: number, V: number, T: number, matrices: number, emissionTable: Float64Array, dense: boolean): EmissionInput {
  const impossibleAt = rng.next() < 0.25 ? rng.nextInt(T) : -1;
  const symbols = Int32Array.from({ length: T }, (_, t) => (t === impossibleAt ? V - 1 : rng.nextInt(V - 1)));
  const transitionIndex = matrices === 1 && rng.next() < 0.5 ? null : Int32Array.from({ length: T }, () => rng.nextInt(matrices));
  if (!dense) return { length: T, scores: emissionTable, rows: symbols, transitionIndex };
  const lattice = new Float64Array((T + (rng.next() < 0.5 ? 0 : 2)) * K);
  for (let t = 0; t < T; t++) lattice.set(emissionTable.subarray(symbols[t] * K, symbols[t] * K + K), t * K);
  return { length: T, scores: lattice, rows: null, transitionIndex };
}

/** Runs both kernels and expects the same path, log-probability and lattice, bit for bit. */
function expectSameAsJs(params: HmmParams, input: EmissionInput, label: string): void {
  const K = params.states;
  const T = input.length;
  const path = new Int32Array(T);
  const delta = new Float64Array(T * K);
  const logProbability = decodeViterbiWasm(params, input, path, delta);
  expect(logProbability, `${label}: the WebAssembly kernel declined`).not.toBeNull();
  const workspace = createViterbiWorkspace(K, T);
  const js = decodeViterbiJs(params, input, new Int32Array(T), workspace);
  expect(Array.from(path), label).toEqual(Array.from(js.path));
  expect(Object.is(logProbability, js.logProbability), `${label}: ${logProbability} vs ${js.logProbability}`).toBe(true);
  expect(firstBitDifference(delta, workspace.delta, T * K), `${label}: first lattice entry that differs`).toBe(-1);
}

describe("decodeViterbiWasm", () => {
  it("runs here: this engine has WebAssembly SIMD, so decodeViterbi uses the kernel", () => {
    expect(isWasmSimdAvailable()).toBe(true);
  });

  it("equals the JavaScript kernels bit for bit on random constrained models (K = 1..24 and above the unroll limit; seeds printed)", () => {
    const sizes = [...Array.from({ length: UNROLL_LIMIT }, (_, k) => k + 1), 25, 26, 33, 40, WASM_STATE_LIMIT];
    for (const K of sizes) {
      for (let seed = 1; seed <= 4; seed++) {
        const rng = createRng(1000 * K + seed);
        const V = 2 + rng.nextInt(30);
        const matrices = 1 + rng.nextInt(3);
        const { params, emissionTable } = constrainedModel(rng, K, V, matrices, seed % 2 === 0);
        for (let n = 0; n < 6; n++) {
          const T = 1 + rng.nextInt(60);
          const dense = n % 2 === 1;
          const input = randomInput(rng, K, V, T, matrices, emissionTable, dense);
          expectSameAsJs(params, input, `seed ${1000 * K + seed} K=${K} T=${T} M=${matrices} ${dense ? "dense" : "gather"} sequence ${n}`);
        }
      }
    }
  });

  it("equals the JavaScript kernels with one transition matrix per token, as the tagger's default configuration decodes", () => {
    for (const [seed, K, T] of [
      [71, 9, 40],
      [72, 17, 25],
      [73, 30, 12],
    ]) {
      const rng = createRng(seed);
      const { params, emissionTable } = constrainedModel(rng, K, 12, T, true);
      const input = randomInput(rng, K, 12, T, T, emissionTable, true);
      expectSameAsJs(params, { ...input, transitionIndex: Int32Array.from({ length: T }, (_, t) => t) }, `seed ${seed} K=${K} T=${T}`);
    }
  });

  it("reports every path impossible as -Infinity with the JavaScript kernels' path", () => {
    for (const K of [1, 2, 9, 17, 30]) {
      const rng = createRng(80 + K);
      const { params, emissionTable } = constrainedModel(rng, K, 5, 1, true);
      const T = 12;
      const symbols = Int32Array.from({ length: T }, (_, t) => (t === 6 ? 4 : rng.nextInt(4)));
      const input = { length: T, scores: emissionTable, rows: symbols, transitionIndex: null };
      expectSameAsJs(params, input, `K=${K}`);
      expect(decodeViterbiWasm(params, input, new Int32Array(T), null), `K=${K}`).toBe(-Infinity);
    }
  });

  it("equals brute-force enumeration on small constrained models (seeds printed on failure)", () => {
    for (let seed = 1; seed <= 60; seed++) {
      const rng = createRng(seed);
      const K = 1 + rng.nextInt(4);
      const V = 3 + rng.nextInt(3);
      const T = 1 + rng.nextInt(6);
      const matrices = 1 + rng.nextInt(2);
      const { params, emissionTable } = constrainedModel(rng, K, V, matrices, rng.next() < 0.5);
      const input = randomInput(rng, K, V, T, matrices, emissionTable, false);
      const brute = enumeratePaths(params, input);
      const path = new Int32Array(T);
      const logProbability = decodeViterbiWasm(params, input, path, null);
      if (brute.bestLogProbability === -Infinity) {
        // No possible path: enumeration keeps the first one (all zeros), Viterbi its tie rule.
        expect(logProbability, `seed ${seed}`).toBe(-Infinity);
        expect(Array.from(path), `seed ${seed}`).toEqual(Array.from(decodeViterbiJs(params, input, new Int32Array(T)).path));
      } else {
        expect(Array.from(path), `seed ${seed}`).toEqual(Array.from(brute.bestPath));
        expect(logProbability!, `seed ${seed}`).toBeCloseTo(brute.bestLogProbability, 10);
      }
    }
  });

  it("keeps results exact while its memory grows and is reused (long sentences between short ones)", () => {
    const rng = createRng(91);
    const K = 9;
    const { params, emissionTable } = constrainedModel(rng, K, 50, 2, true);
    for (const T of [3, 700, 5, 2000, 1, 40]) {
      expectSameAsJs(params, randomInput(rng, K, 50, T, 2, emissionTable, T % 2 === 0), `T=${T}`);
    }
    const perToken = constrainedModel(rng, K, 50, 900, false);
    expectSameAsJs(perToken.params, randomInput(rng, K, 50, 900, 900, perToken.emissionTable, true), "900 matrices");
  });

  it("declines NaN, +Infinity and (K ≤ 24) −0 lattice entries, and decodeViterbi then answers as the JavaScript kernels do", () => {
    const rng = createRng(95);
    for (const K of [5, 24, 30]) {
      const { params, emissionTable } = randomHmm(rng, K, 6, { end: true });
      const symbols = Int32Array.from({ length: 8 }, () => rng.nextInt(6));
      const input = { length: 8, scores: emissionTable, rows: symbols, transitionIndex: null };
      const nanTransition = { ...params, transitions: params.transitions.slice() };
      nanTransition.transitions[K + 1] = NaN;
      const infiniteEnd = { ...params, end: params.end!.slice() };
      infiniteEnd.end[0] = Infinity;
      const infiniteEmission = { ...input, scores: emissionTable.slice() };
      infiniteEmission.scores[symbols[3] * K + 1] = Infinity;
      const nanStart = { ...params, start: params.start.slice() };
      nanStart.start[K - 1] = NaN;
      const cases: [HmmParams, EmissionInput][] = [
        [nanTransition, input],
        [infiniteEnd, input],
        [params, infiniteEmission],
        [nanStart, input],
      ];
      for (const [p, i] of cases) {
        expect(decodeViterbiWasm(p, i, new Int32Array(8), null), `K=${K}`).toBeNull();
        const viaPublic = decodeViterbi(p, i);
        const js = decodeViterbiJs(p, i, new Int32Array(8));
        expect(Array.from(viaPublic.path)).toEqual(Array.from(js.path));
        expect(Object.is(viaPublic.logProbability, js.logProbability)).toBe(true);
      }
    }
  });

  it("declines a −0 entry where Math.max and pmax differ (K ≤ 24), and matches the first-maximum loop bit for bit above", () => {
    // Token 1, state 0: the candidates −0 (from state 0) and +0 (from state 1) tie; Math.max
    // gives +0, the first maximum −0; adding the emission score −0 keeps the difference.
    for (const K of [2, 24, 26]) {
      const start = new Float64Array(K).fill(-5);
      start[0] = -0;
      start[1] = 0;
      const transitions = new Float64Array(K * K).fill(-3);
      transitions[0] = -0; // 0 → 0
      transitions[K] = -0; // 1 → 0
      const scores = new Float64Array(2 * K).fill(-1);
      scores[0] = -0;
      scores[1] = 0;
      scores[K] = -0;
      const params = { states: K, start, transitions, end: null };
      const input = { length: 2, scores, rows: null, transitionIndex: null };
      const workspace = createViterbiWorkspace(K, 2);
      const js = decodeViterbiJs(params, input, new Int32Array(2), workspace);
      if (K <= UNROLL_LIMIT) {
        expect(decodeViterbiWasm(params, input, new Int32Array(2), null)).toBeNull();
        expect(Object.is(workspace.delta[K], 0)).toBe(true);
        const viaPublic = createViterbiWorkspace(K, 2);
        decodeViterbi(params, input, undefined, viaPublic);
        expect(firstBitDifference(viaPublic.delta, workspace.delta, 2 * K)).toBe(-1);
      } else {
        expect(Object.is(workspace.delta[K], -0)).toBe(true);
        expectSameAsJs(params, input, `K=${K}`);
      }
      expect(Array.from(js.path)).toEqual([0, 0]);
    }
  });

  it("breaks ties toward the lowest state as enumeration does: every path equally likely (K = 1, 2, 3, 9, 17; T = 1..4)", () => {
    // Brute force over all K^T paths (enumeratePaths keeps the first best path in lexicographic
    // order, here all zeros); the looped forward pass (K ≥ 3) and the straight-line one (K ≤ 2) both.
    for (const K of [1, 2, 3, 9, 17]) {
      for (let T = 1; T <= (K > 9 ? 3 : 4); T++) {
        const params = { states: K, start: new Float64Array(K).fill(-Math.log(K)), transitions: new Float64Array(K * K).fill(-Math.log(K)), end: null };
        const input = { length: T, scores: new Float64Array(2 * K).fill(-0.5), rows: new Int32Array(T).fill(1), transitionIndex: null };
        const path = new Int32Array(T).fill(-1);
        const logProbability = decodeViterbiWasm(params, input, path, null);
        const brute = enumeratePaths(params, input);
        expect(Array.from(path), `K=${K} T=${T}`).toEqual(Array.from(brute.bestPath));
        expect(Array.from(path), `K=${K} T=${T}`).toEqual(new Array<number>(T).fill(0));
        expect(logProbability!, `K=${K} T=${T}`).toBeCloseTo(brute.bestLogProbability, 12);
        expectSameAsJs(params, input, `all ties K=${K} T=${T}`);
      }
    }
  });

  it("equals the JavaScript kernels with many partial ties and −Infinity cells, one token and longer (scores on a coarse grid; seeds printed)", () => {
    // Scores drawn from {−∞, −3, −2, −1}: sums tie often, so the first maximum must be the one
    // the JavaScript loops' strict `>` keeps, in the forward maxima and the backtrace alike.
    const grid = [-Infinity, -3, -2, -1];
    for (const K of [1, 2, 3, 4, 5, 8, 9, 16, 17, 24, 25]) {
      for (let seed = 1; seed <= 3; seed++) {
        const rng = createRng(5000 + 100 * K + seed);
        const draw = (n: number, allowInfinity: boolean) => Float64Array.from({ length: n }, () => grid[(allowInfinity ? 0 : 1) + rng.nextInt(allowInfinity ? 4 : 3)]);
        const params = { states: K, start: draw(K, true), transitions: draw(K * K, true), end: seed === 2 ? draw(K, false) : null };
        const V = 6;
        const emissionTable = draw(V * K, true);
        for (const T of [1, 2, 7, 31]) {
          const rows = Int32Array.from({ length: T }, () => rng.nextInt(V));
          expectSameAsJs(params, { length: T, scores: emissionTable, rows, transitionIndex: null }, `seed ${5000 + 100 * K + seed} K=${K} T=${T}`);
        }
      }
    }
  });
});
