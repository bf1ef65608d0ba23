import { describe, expect, it } from "vitest";
import { createRng } from "../util/random";
import { learningCurvePlan } from "./learning-curve";

describe("learningCurvePlan", () => {
  it("plans nested subsets of the default sizes", () => {
    const plan = learningCurvePlan(40, { rng: createRng(3) });
    // Worked by hand: round(0.1·40) = 4, round(0.25·40) = 10, 20, 30, 40.
    expect(plan.map((s) => s.fraction)).toEqual([0.1, 0.25, 0.5, 0.75, 1]);
    expect(plan.map((s) => s.documentIndices.length)).toEqual([4, 10, 20, 30, 40]);
    for (let k = 0; k < plan.length; k++) {
      const indices = plan[k].documentIndices;
      expect([...indices].sort((x, y) => x - y)).toEqual(indices);
      expect(new Set(indices).size).toBe(indices.length);
      for (const i of indices) expect(i >= 0 && i < 40 && Number.isInteger(i)).toBe(true);
      if (k > 0) {
        const larger = new Set(indices);
        for (const i of plan[k - 1].documentIndices) expect(larger.has(i)).toBe(true);
      }
    }
    expect(plan[4].documentIndices).toEqual(Array.from({ length: 40 }, (_, i) => i));
  });

  it("keeps at least one document per step and accepts custom fractions", () => {
    const plan = learningCurvePlan(3, { rng: createRng(1), fractions: [0.1, 0.5, 0.9] });
    // Worked by hand: max(1, round(0.3)) = 1, round(1.5) = 2, round(2.7) = 3.
    expect(plan.map((s) => s.documentIndices.length)).toEqual([1, 2, 3]);
  });

  it("is reproducible for a seed", () => {
    expect(learningCurvePlan(50, { rng: createRng(9) })).toEqual(learningCurvePlan(50, { rng: createRng(9) }));
    expect(learningCurvePlan(50, { rng: createRng(9) })[0]).not.toEqual(learningCurvePlan(50, { rng: createRng(10) })[0]);
  });

  it("picks every document for the smallest subset about equally often (chi-square, 9 df)", () => {
    // Chi-square upper critical value for 9 degrees of freedom at p = 0.001 is 27.88 (NIST/SEMATECH
    // e-Handbook of Statistical Methods, §1.3.6.7.4).
    const counts = new Array<number>(10).fill(0);
    const runs = 20_000;
    const rng = createRng(77);
    for (let r = 0; r < runs; r++) {
      for (const i of learningCurvePlan(10, { rng, fractions: [0.3, 1] })[0].documentIndices) counts[i]++;
    }
    const expected = (runs * 3) / 10;
    const chi2 = counts.reduce((s, c) => s + (c - expected) ** 2 / expected, 0);
    expect(chi2).toBeLessThan(27.88);
  });

  it("rejects bad input", () => {
    const rng = createRng(1);
    expect(() => learningCurvePlan(0, { rng })).toThrow(RangeError);
    expect(() => learningCurvePlan(2.5, { rng })).toThrow(RangeError);
    expect(() => learningCurvePlan(10, { rng, fractions: [] })).toThrow(RangeError);
    expect(() => learningCurvePlan(10, { rng, fractions: [0.5, 0.5] })).toThrow("fractions must increase: 0.5 then 0.5");
    expect(() => learningCurvePlan(10, { rng, fractions: [0, 1] })).toThrow(RangeError);
    expect(() => learningCurvePlan(10, { rng, fractions: [0.5, 1.5] })).toThrow(RangeError);
  });
});
