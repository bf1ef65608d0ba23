import { describe, expect, it } from "vitest";
import { computeBackward } from "./backward";
import { accumulateTransitionPosteriors, computePosteriors } from "./forward-backward";
import { computeForward } from "./forward";
import { createRng } from "../util/random";
import { eisner, eisnerDays, enumeratePaths, iceCream, iceCreamSymbols, randomHmm, symbolsInput, umbrella } from "../testing/hmm-fixtures";
import { logSumExp } from "../util/math";

describe("computePosteriors", () => {
  it("ice-cream HMM of J&M 3rd ed. draft, Appendix A: gamma(H) = .9366, .3961, .8226 for 3 1 3, computed from the book's parameters", () => {
    // The book gives the model, not these posteriors. From the hand-worked forward values
    // (forward.test.ts) and β: β2 = (.6·.4 + .4·.1, .5·.4 + .5·.1) = (.28, .25),
    // β1(H) = .6·.2·.28 + .4·.5·.25 = .0836, so γ1(H) = .32·.0836/.028562 = .9366; likewise the rest.
    const { params, emissionTable } = iceCream;
    const { posteriors } = computePosteriors(params, symbolsInput(emissionTable, iceCreamSymbols([3, 1, 3])));
    expect([posteriors[0], posteriors[2], posteriors[4]].map((p) => Number(p.toFixed(4)))).toEqual([0.9366, 0.3961, 0.8226]);
  });

  it("Russell & Norvig, AIMA 3rd ed. §15.2 umbrella model: smoothed gamma(R) = .8673, .8204, .3075, .8204, .8673, computed from the book's parameters", () => {
    // AIMA prints smoothing only for its two-day example (§15.2.2, .883); these five-day values are
    // computed from its parameters (and agree with brute force, as the random-model test checks).
    const { params, emissionTable } = umbrella;
    const { posteriors } = computePosteriors(params, symbolsInput(emissionTable, Int32Array.from([0, 0, 1, 0, 0])));
    expect([0, 1, 2, 3, 4].map((t) => Number(posteriors[2 * t].toFixed(4)))).toEqual([0.8673, 0.8204, 0.3075, 0.8204, 0.8673]);
  });

  it("Eisner (2002) spreadsheet: P(H) day 1 .871, day 2 .977; with day 1 changed to 1: .491, .918 (as the spreadsheet shows them)", () => {
    // Eisner (2002), "An Interactive Spreadsheet for Teaching the Forward-Backward Algorithm", the
    // posterior column of the spreadsheet for its 33 days and for day 1 changed to one ice cream.
    const { params, emissionTable } = eisner;
    const first = computePosteriors(params, symbolsInput(emissionTable, iceCreamSymbols(eisnerDays))).posteriors;
    expect([first[1], first[3]].map((p) => Number(p.toFixed(3)))).toEqual([0.871, 0.977]);
    const changed = [1, ...eisnerDays.slice(1)];
    const second = computePosteriors(params, symbolsInput(emissionTable, iceCreamSymbols(changed))).posteriors;
    expect([second[1], second[3]].map((p) => Number(p.toFixed(3)))).toEqual([0.491, 0.918]);
  });

  it("posteriors sum to 1 at every token and match brute force (seeds printed on failure)", () => {
    for (let seed = 200; seed < 240; seed++) {
      const rng = createRng(seed);
      const K = 2 + rng.nextInt(3);
      const V = 2 + rng.nextInt(4);
      const T = 1 + rng.nextInt(6);
      const { params, emissionTable } = randomHmm(rng, K, V, { end: rng.next() < 0.5, matrices: 2 });
      const input = symbolsInput(emissionTable, Int32Array.from({ length: T }, () => rng.nextInt(V)), Int32Array.from({ length: T }, () => rng.nextInt(2)));
      const { posteriors, logLikelihood } = computePosteriors(params, input);
      const brute = enumeratePaths(params, input);
      expect(logLikelihood, `seed ${seed}`).toBeCloseTo(brute.logLikelihood, 10);
      for (let t = 0; t < T; t++) {
        let sum = 0;
        for (let k = 0; k < K; k++) {
          sum += posteriors[t * K + k];
          expect(posteriors[t * K + k], `seed ${seed} t ${t} k ${k}`).toBeCloseTo(brute.posteriors[t * K + k], 10);
        }
        expect(sum, `seed ${seed} t ${t}`).toBeCloseTo(1, 12);
      }
    }
  });

  it("forward and backward give the same likelihood at every position", () => {
    const { params, emissionTable } = eisner;
    const input = symbolsInput(emissionTable, iceCreamSymbols(eisnerDays));
    const { alpha, logLikelihood } = computeForward(params, input);
    const beta = computeBackward(params, input);
    const combined = new Float64Array(2);
    for (let t = 0; t < eisnerDays.length; t++) {
      combined[0] = alpha[2 * t] + beta[2 * t];
      combined[1] = alpha[2 * t + 1] + beta[2 * t + 1];
      expect(logSumExp(combined)).toBeCloseTo(logLikelihood, 9);
    }
  });

  it("refuses a sequence of probability 0", () => {
    const { params, emissionTable } = iceCream;
    const impossible = { ...params, start: new Float64Array([-Infinity, -Infinity]) };
    expect(() => computePosteriors(impossible, symbolsInput(emissionTable, iceCreamSymbols([1])))).toThrow(/probability 0/);
  });
});

describe("accumulateTransitionPosteriors", () => {
  it("expected transition counts equal brute-force expectations and sum to T−1 (seeds printed on failure)", () => {
    for (let seed = 300; seed < 320; seed++) {
      const rng = createRng(seed);
      const K = 2 + rng.nextInt(2);
      const T = 2 + rng.nextInt(4);
      const { params, emissionTable } = randomHmm(rng, K, 3, { end: true });
      const input = symbolsInput(emissionTable, Int32Array.from({ length: T }, () => rng.nextInt(3)));
      const post = computePosteriors(params, input);
      const target = new Float64Array(K * K);
      const start = new Float64Array(K);
      const end = new Float64Array(K);
      accumulateTransitionPosteriors(params, input, post, 2, target, start, end);
      // Brute force: weight every path by its posterior probability.
      const expected = new Float64Array(K * K);
      const path = new Int32Array(T);
      const total = K ** T;
      for (let n = 0; n < total; n++) {
        let rest = n;
        for (let t = T - 1; t >= 0; t--) {
          path[t] = rest % K;
          rest = Math.floor(rest / K);
        }
        let lp = params.start[path[0]] + emissionTable[input.rows![0] * K + path[0]];
        for (let t = 1; t < T; t++) lp += params.transitions[path[t - 1] * K + path[t]] + emissionTable[input.rows![t] * K + path[t]];
        lp += params.end![path[T - 1]];
        const w = Math.exp(lp - post.logLikelihood);
        for (let t = 1; t < T; t++) expected[path[t - 1] * K + path[t]] += 2 * w;
      }
      expected.forEach((v, x) => expect(target[x], `seed ${seed} cell ${x}`).toBeCloseTo(v, 10));
      expect(target.reduce((a, b) => a + b, 0), `seed ${seed}`).toBeCloseTo(2 * (T - 1), 10);
      expect(start.reduce((a, b) => a + b, 0)).toBeCloseTo(2, 12);
      expect(end.reduce((a, b) => a + b, 0)).toBeCloseTo(2, 12);
    }
  });
});
