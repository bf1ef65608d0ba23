import { describe, expect, it } from "vitest";
import { computeForward } from "./forward";
import { createRng } from "../util/random";
import { eisner, eisnerDays, enumeratePaths, healthFever, iceCream, iceCreamSymbols, randomHmm, symbolsInput, umbrella } from "../testing/hmm-fixtures";
import { createTransitionCache } from "./transition-cache";

describe("computeForward", () => {
  it("ice-cream HMM of J&M 3rd ed. draft, Appendix A: alphas for 3 1 3 and P(3 1 3) = 0.028562, computed from the book's parameters", () => {
    // Jurafsky & Martin, Speech and Language Processing, 3rd ed. draft, Appendix A "Hidden Markov
    // Models": the model (π, A, B) is the book's; the numbers are worked by hand from it:
    // α1 = (.8·.4, .2·.1) = (.32, .02); α2(H) = (.32·.6 + .02·.5)·.2 = .0404,
    // α2(C) = (.32·.4 + .02·.5)·.5 = .069; α3(H) = (.0404·.6 + .069·.5)·.4 = .023496,
    // α3(C) = (.0404·.4 + .069·.5)·.1 = .005066; P(3 1 3) = .023496 + .005066 = .028562.
    const { params, emissionTable } = iceCream;
    const { alpha, logLikelihood } = computeForward(params, symbolsInput(emissionTable, iceCreamSymbols([3, 1, 3])));
    const expected = [0.32, 0.02, 0.0404, 0.069, 0.023496, 0.005066];
    expected.forEach((v, x) => expect(Math.exp(alpha[x])).toBeCloseTo(v, 12));
    expect(Math.exp(logLikelihood)).toBeCloseTo(0.028562, 12);
  });

  it("Russell & Norvig, AIMA 3rd ed. §15.2: filtering .818, .883 (printed) and P(T T F T T) = 0.0343037005 (computed from the book's parameters)", () => {
    // Russell & Norvig, Artificial Intelligence: A Modern Approach, 3rd ed., §15.2.1, umbrella
    // world: the book prints the filtered P(rain) .818 and .883 for days 1 and 2. It does not print
    // P(T T F T T); that value is computed from its parameters (and matches the brute-force sum
    // over all 32 paths, as the random-model test below checks in general).
    const { params, emissionTable } = umbrella;
    const { alpha, logLikelihood } = computeForward(params, symbolsInput(emissionTable, Int32Array.from([0, 0, 1, 0, 0])));
    const filtered = (t: number) => Math.exp(alpha[2 * t]) / (Math.exp(alpha[2 * t]) + Math.exp(alpha[2 * t + 1]));
    expect(filtered(0)).toBeCloseTo(0.818, 3);
    expect(filtered(1)).toBeCloseTo(0.883, 3);
    expect(Math.exp(logLikelihood)).toBeCloseTo(0.0343037005, 10);
  });

  it("Wikipedia 'Viterbi algorithm' example model: P(normal cold dizzy) = 0.03628, computed from its parameters", () => {
    // Wikipedia, "Viterbi algorithm", section "Example" (Healthy/Fever): the article prints the
    // model and the best path, not this likelihood. By hand: α1 = (.6·.5, .4·.1) = (.3, .04);
    // α2 = ((.3·.7 + .04·.4)·.4, (.3·.3 + .04·.6)·.3) = (.0904, .0342);
    // α3 = ((.0904·.7 + .0342·.4)·.1, (.0904·.3 + .0342·.6)·.6) = (.007696, .028584); sum .03628.
    const { params, emissionTable } = healthFever;
    const { logLikelihood } = computeForward(params, symbolsInput(emissionTable, Int32Array.from([0, 1, 2])));
    expect(Math.exp(logLikelihood)).toBeCloseTo(0.03628, 12);
  });

  it("Eisner (2002) spreadsheet model, 33 days with STOP: P(data) = 9.12756e-19, computed from its parameters", () => {
    // Eisner (2002), "An Interactive Spreadsheet for Teaching the Forward-Backward Algorithm":
    // the parameters and days are the spreadsheet's; the likelihood is computed from them, not
    // taken from the source, so it pins the value against later changes.
    const { params, emissionTable } = eisner;
    const { logLikelihood } = computeForward(params, symbolsInput(emissionTable, iceCreamSymbols(eisnerDays)));
    expect(Math.exp(logLikelihood) / 9.12756e-19).toBeCloseTo(1, 5);
  });

  it("equals the brute-force sum over paths on random models (seeds printed on failure)", () => {
    for (let seed = 100; seed < 140; seed++) {
      const rng = createRng(seed);
      const K = 2 + rng.nextInt(3);
      const V = 2 + rng.nextInt(4);
      const T = 1 + rng.nextInt(6);
      const { params, emissionTable } = randomHmm(rng, K, V, { end: rng.next() < 0.5, matrices: 2 });
      const input = symbolsInput(emissionTable, Int32Array.from({ length: T }, () => rng.nextInt(V)), Int32Array.from({ length: T }, () => rng.nextInt(2)));
      const { logLikelihood } = computeForward(params, input, undefined, createTransitionCache());
      expect(logLikelihood, `seed ${seed}`).toBeCloseTo(enumeratePaths(params, input).logLikelihood, 10);
    }
  });

  it("keeps full precision when rescaled sums would underflow (probabilities near 1e-300)", () => {
    // Transition probabilities of 1e-300 make every rescaled sum tiny; the exact fallback must agree
    // with the definition computed from logs.
    const tiny = Math.log(1e-300);
    const params = { states: 2, start: new Float64Array([0, -Infinity]), transitions: new Float64Array([tiny, tiny, tiny, tiny]), end: null };
    const table = new Float64Array([Math.log(0.5), Math.log(0.5)]);
    const { logLikelihood } = computeForward(params, symbolsInput(table, new Int32Array(3)));
    // Paths: start in state 0, then 2 steps with 2 choices each of probability 1e-300 × 0.5.
    const expected = Math.log(0.5) + 2 * (Math.log(2) + tiny + Math.log(0.5));
    expect(logLikelihood).toBeCloseTo(expected, 9);
  });
});
