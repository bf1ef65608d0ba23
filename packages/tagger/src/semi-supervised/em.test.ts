import { describe, expect, it } from "vitest";
import { computeExpectedCounts, trainBaumWelch } from "./em";
import { createRng } from "../util/random";
import { eisnerDays, iceCream, iceCreamSymbols, randomHmm } from "../testing/hmm-fixtures";

describe("trainBaumWelch", () => {
  it("J&M ice-cream start, Eisner's 33 days: ln P = −36.576833, −36.024491, −35.808835, −35.438321, −34.843461 (as NLTK's Baum–Welch gives them)", () => {
    // Start: Jurafsky & Martin, Speech and Language Processing, 3rd ed. draft, Appendix A, the
    // ice-cream HMM; data: the 33 days of Eisner (2002), "An Interactive Spreadsheet for Teaching
    // the Forward-Backward Algorithm". Neither source prints these log-likelihoods: they are what
    // NLTK 3.8's HiddenMarkovModelTrainer.train_unsupervised gives on the same start and data
    // (start distribution re-estimated too); test/nltk-baum-welch.test.ts compares the two live,
    // with every re-estimated parameter.
    const { params, emissionTable } = iceCream;
    const { history } = trainBaumWelch(params, emissionTable, [iceCreamSymbols(eisnerDays)], { iterations: 5 });
    expect(history.map((x) => Number(x.toFixed(6)))).toEqual([-36.576833, -36.024491, -35.808835, -35.438321, -34.843461]);
  });

  it("never decreases the log-likelihood and keeps every distribution normalised (seeds printed on failure)", () => {
    for (let seed = 1; seed <= 12; seed++) {
      const rng = createRng(seed);
      const K = 2 + rng.nextInt(3);
      const V = 3 + rng.nextInt(4);
      const { params, emissionTable } = randomHmm(rng, K, V, { end: rng.next() < 0.5 });
      const sequences = Array.from({ length: 4 }, () => Int32Array.from({ length: 3 + rng.nextInt(8) }, () => rng.nextInt(V)));
      const result = trainBaumWelch(params, emissionTable, sequences, { iterations: 15 });
      for (let n = 1; n < result.history.length; n++) expect(result.history[n], `seed ${seed} iteration ${n}`).toBeGreaterThanOrEqual(result.history[n - 1] - 1e-9);
      const sum = (xs: ArrayLike<number>, from: number, count: number, stride = 1) => {
        let s = 0;
        for (let x = 0; x < count; x++) s += Math.exp(xs[from + x * stride]);
        return s;
      };
      expect(sum(result.params.start, 0, K), `seed ${seed}`).toBeCloseTo(1, 12);
      for (let i = 0; i < K; i++) {
        const row = sum(result.params.transitions, i * K, K) + (result.params.end === null ? 0 : Math.exp(result.params.end[i]));
        expect(row, `seed ${seed} row ${i}`).toBeCloseTo(1, 12);
        expect(sum(result.emissionTable, i, V, K), `seed ${seed} emission ${i}`).toBeCloseTo(1, 12);
      }
    }
  });

  it("expected counts add up to the number of tokens, transitions and sequences", () => {
    const { params, emissionTable } = iceCream;
    const seqs = [iceCreamSymbols([3, 1, 3]), iceCreamSymbols([1, 1, 2, 3])];
    const counts = computeExpectedCounts(params, emissionTable, seqs);
    expect(counts.emissions.reduce((a, b) => a + b, 0)).toBeCloseTo(7, 12);
    expect(counts.transitions.reduce((a, b) => a + b, 0)).toBeCloseTo(5, 12);
    expect(counts.start.reduce((a, b) => a + b, 0)).toBeCloseTo(2, 12);
  });
});
