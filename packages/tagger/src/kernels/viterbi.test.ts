import { describe, expect, it } from "vitest";
import { createRng } from "../util/random";
import { eisner, enumeratePaths, healthFever, iceCream, iceCreamSymbols, randomHmm, symbolsInput, umbrella } from "../testing/hmm-fixtures";
import { createViterbiWorkspace, decodeViterbi, decodeViterbiJs } from "./viterbi";

describe("decodeViterbi", () => {
  it("ice-cream HMM of J&M 3rd ed. draft, Appendix A (no end state): 3 1 3 → H C H, p = 0.0128, computed from the book's parameters", () => {
    // Jurafsky & Martin, Speech and Language Processing, 3rd ed. draft, Appendix A: the model is
    // the book's; worked by hand from it: δ1 = (.32, .02); δ2(H) = max(.32·.6, .02·.5)·.2 = .0384,
    // δ2(C) = max(.32·.4, .02·.5)·.5 = .064; δ3(H) = max(.0384·.6, .064·.5)·.4 = .0128 (from C),
    // δ3(C) = max(.0384·.4, .064·.5)·.1 = .0032 → best H C H with p = .0128.
    const { params, emissionTable } = iceCream;
    const { path, logProbability } = decodeViterbi(params, symbolsInput(emissionTable, iceCreamSymbols([3, 1, 3])));
    expect(Array.from(path)).toEqual([0, 1, 0]);
    expect(Math.exp(logProbability)).toBeCloseTo(0.0128, 12);
  });

  it("Russell & Norvig, AIMA 3rd ed. §15.2 umbrella: T T F T T → R R ¬R R R (printed), p = 0.011573604 (computed from the book's parameters)", () => {
    // AIMA 3rd ed. §15.2.3, Fig. 15.5: the book prints the best path; its probability is computed
    // from the book's parameters (the book prints normalised messages, checked in the next test).
    const { params, emissionTable } = umbrella;
    const { path, logProbability } = decodeViterbi(params, symbolsInput(emissionTable, Int32Array.from([0, 0, 1, 0, 0])));
    expect(Array.from(path)).toEqual([0, 0, 1, 0, 0]);
    expect(Math.exp(logProbability)).toBeCloseTo(0.011573604, 9);
  });

  it("AIMA 3rd ed. Fig. 15.5(b): the last Viterbi message m_1:5 = (.0210, .0024) (scores divided by P(e_1) = 0.55)", () => {
    const { params, emissionTable } = umbrella;
    const workspace = createViterbiWorkspace(2, 8);
    decodeViterbi(params, symbolsInput(emissionTable, Int32Array.from([0, 0, 1, 0, 0])), undefined, workspace);
    // AIMA starts from the filtered P(X_1 | e_1), i.e. delta_1 / P(e_1).
    expect(Number((Math.exp(workspace.delta[8]) / 0.55).toFixed(4))).toBe(0.021);
    expect(Number((Math.exp(workspace.delta[9]) / 0.55).toFixed(4))).toBe(0.0024);
  });

  it("Wikipedia 'Viterbi algorithm' example: normal cold dizzy → H H F, p = 0.01512 (both printed)", () => {
    // Wikipedia, "Viterbi algorithm", section "Example" (Healthy/Fever).
    const { params, emissionTable } = healthFever;
    const { path, logProbability } = decodeViterbi(params, symbolsInput(emissionTable, Int32Array.from([0, 1, 2])));
    expect(Array.from(path)).toEqual([0, 0, 1]);
    expect(Math.exp(logProbability)).toBeCloseTo(0.01512, 12);
  });

  it("equals brute-force enumeration on small random models (seeds printed on failure)", () => {
    for (let seed = 1; seed <= 40; seed++) {
      const rng = createRng(seed);
      const K = 2 + rng.nextInt(3);
      const V = 2 + rng.nextInt(4);
      const T = 1 + rng.nextInt(6);
      const matrices = 1 + rng.nextInt(2);
      const { params, emissionTable } = randomHmm(rng, K, V, { end: rng.next() < 0.5, matrices });
      const symbols = Int32Array.from({ length: T }, () => rng.nextInt(V));
      const tIndex = Int32Array.from({ length: T }, () => rng.nextInt(matrices));
      const input = symbolsInput(emissionTable, symbols, tIndex);
      const brute = enumeratePaths(params, input);
      for (const { path, logProbability } of [decodeViterbi(params, input), decodeViterbiJs(params, input, new Int32Array(T))]) {
        expect(Array.from(path), `seed ${seed}`).toEqual(Array.from(brute.bestPath));
        expect(logProbability, `seed ${seed}`).toBeCloseTo(brute.bestLogProbability, 10);
      }
    }
  });

  it("agrees with brute force on every code path: WebAssembly, unrolled (K ≤ 24) and plain loops (K = 26), shared and per-step matrices", () => {
    for (const [seed, K, T, matrices] of [
      [51, 24, 3, 1],
      [52, 24, 3, 3],
      [53, 26, 3, 1],
      [54, 26, 3, 2],
      [55, 5, 1, 1],
    ]) {
      const rng = createRng(seed);
      const { params, emissionTable } = randomHmm(rng, K, 4, { matrices, end: seed % 2 === 0 });
      const input = symbolsInput(emissionTable, Int32Array.from({ length: T }, () => rng.nextInt(4)), Int32Array.from({ length: T }, () => rng.nextInt(matrices)));
      const brute = enumeratePaths(params, input);
      for (const { path, logProbability } of [decodeViterbi(params, input), decodeViterbiJs(params, input, new Int32Array(T))]) {
        expect(Array.from(path), `seed ${seed}`).toEqual(Array.from(brute.bestPath));
        expect(logProbability, `seed ${seed}`).toBeCloseTo(brute.bestLogProbability, 10);
      }
    }
  });

  it("breaks exact ties toward the lowest state index", () => {
    // Two identical states: every path has the same probability, so the answer is all zeros.
    const params = { states: 2, start: new Float64Array([Math.log(0.5), Math.log(0.5)]), transitions: new Float64Array(4).fill(Math.log(0.5)), end: null };
    const table = new Float64Array([Math.log(0.3), Math.log(0.3)]);
    const { path } = decodeViterbi(params, symbolsInput(table, new Int32Array(4)));
    expect(Array.from(path)).toEqual([0, 0, 0, 0]);
  });

  it("never takes a forbidden (-Infinity) transition and reports an impossible sequence as -Infinity", () => {
    const { params, emissionTable } = eisner;
    const transitions = params.transitions.slice();
    transitions[0 * 2 + 1] = -Infinity; // C → H forbidden
    const constrained = { ...params, transitions };
    const { path } = decodeViterbi(constrained, symbolsInput(emissionTable, iceCreamSymbols([1, 1, 3, 3, 3])));
    for (let t = 1; t < path.length; t++) expect(path[t - 1] === 0 && path[t] === 1).toBe(false);
    const impossible = { ...params, start: new Float64Array([-Infinity, -Infinity]) };
    expect(decodeViterbi(impossible, symbolsInput(emissionTable, iceCreamSymbols([1, 2]))).logProbability).toBe(-Infinity);
  });

  it("reuses a workspace and output buffer without changing the result", () => {
    const { params, emissionTable } = eisner;
    const input = symbolsInput(emissionTable, iceCreamSymbols([2, 3, 3, 2, 3, 2, 3, 2, 2, 3, 1, 3]));
    const fresh = decodeViterbi(params, input);
    const ws = createViterbiWorkspace(2, 64);
    const out = new Int32Array(64).fill(-1);
    const reused = decodeViterbi(params, input, out, ws);
    expect(Array.from(reused.path.subarray(0, 12))).toEqual(Array.from(fresh.path));
    expect(reused.logProbability).toBe(fresh.logProbability);
  });

  it("throws a RangeError naming the sizes when shapes disagree", () => {
    const { params, emissionTable } = iceCream;
    expect(() => decodeViterbi({ ...params, start: new Float64Array(3) }, symbolsInput(emissionTable, iceCreamSymbols([1])))).toThrow(/start has length 3, expected K=2/);
    expect(() => decodeViterbi(params, symbolsInput(emissionTable, Int32Array.from([7])))).toThrow(/rows\[0\]=7 outside the 3×2 emission table/);
    expect(() => decodeViterbi(params, symbolsInput(emissionTable, iceCreamSymbols([1, 2])), new Int32Array(1))).toThrow(RangeError);
  });

  it("does not modify its inputs", () => {
    const { params, emissionTable } = umbrella;
    const before = [params.start.slice(), params.transitions.slice(), emissionTable.slice()];
    decodeViterbi(params, symbolsInput(emissionTable, Int32Array.from([0, 1, 0])));
    expect([params.start, params.transitions, emissionTable]).toEqual(before);
  });
});
