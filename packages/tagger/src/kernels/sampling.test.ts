import { describe, expect, it } from "vitest";
import { computeForward } from "./forward";
import { createRng } from "../util/random";
import { sampleStatePath } from "./sampling";
import { enumeratePaths, randomHmm, symbolsInput } from "../testing/hmm-fixtures";

describe("sampleStatePath (forward filtering, backward sampling)", () => {
  it("draws paths with their posterior frequencies (chi-square against brute force, seed printed)", () => {
    const seed = 11;
    const rng = createRng(seed);
    const { params, emissionTable } = randomHmm(rng, 2, 3, { end: true, matrices: 2 });
    const input = symbolsInput(emissionTable, Int32Array.from([0, 2, 1]), Int32Array.from([0, 1, 0]));
    const { alpha } = computeForward(params, input);
    const brute = enumeratePaths(params, input);
    const draws = 20000;
    const counts = new Float64Array(3 * 2);
    const sampler = createRng(seed + 1);
    for (let n = 0; n < draws; n++) {
      const path = sampleStatePath(params, input, alpha, sampler);
      path.forEach((k, t) => counts[t * 2 + k]++);
    }
    // Marginal frequencies within 4 standard errors of the exact posteriors.
    brute.posteriors.forEach((p, x) => {
      const se = Math.sqrt((p * (1 - p)) / draws);
      expect(Math.abs(counts[x] / draws - p), `seed ${seed} cell ${x}`).toBeLessThan(4 * se + 1e-12);
    });
  });

  it("is reproducible for a fixed seed and never draws a forbidden transition", () => {
    const rng = createRng(5);
    const { params, emissionTable } = randomHmm(rng, 3, 4);
    const transitions = params.transitions.slice();
    transitions[0 * 3 + 1] = -Infinity;
    const constrained = { ...params, transitions };
    const input = symbolsInput(emissionTable, Int32Array.from([0, 1, 2, 3, 0, 1, 2, 3]));
    const { alpha } = computeForward(constrained, input);
    const a = Array.from({ length: 50 }, () => Array.from(sampleStatePath(constrained, input, alpha, createRng(99)))).at(-1);
    const b = Array.from(sampleStatePath(constrained, input, alpha, createRng(99)));
    expect(a, "seed 99").toEqual(b);
    const sampler = createRng(7);
    for (let n = 0; n < 500; n++) {
      const p = sampleStatePath(constrained, input, alpha, sampler);
      for (let t = 1; t < p.length; t++) expect(p[t - 1] === 0 && p[t] === 1, "seed 7").toBe(false);
    }
  });
});
