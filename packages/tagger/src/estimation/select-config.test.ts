import { describe, expect, it } from "vitest";
import { pairedGainTest, selectConfiguration } from "./select-config";
import type { ColumnDocument } from "../text/conll";

// A tag sequence with period 4 (X X Y Y X X Y Y) over one repeated word: the next tag is a
// function of the two previous tags but not of the previous tag alone (after X comes X or Y
// equally often). A second-order (trigram) model can decode it exactly, a first-order one cannot
// (Jurafsky & Martin, "Speech and Language Processing", 2nd ed., §5.5.2 on trigram HMM
// taggers; the example is ours).
function periodFour(documents: number, length: number): ColumnDocument[] {
  const pattern = ["X", "X", "Y", "Y"];
  return Array.from({ length: documents }, () => ({
    sentences: [{ words: Array.from({ length }, () => "w"), tags: Array.from({ length }, (_, t) => pattern[t % 4]) }],
  }));
}

describe("selectConfiguration", () => {
  it("chooses the trigram model when the tags need two tags of history", () => {
    const result = selectConfiguration(periodFour(12, 10), {}, { refinements: [] });
    expect(result.skipped).toBeNull();
    expect(result.chosen.name).toBe("trigram");
    const score = Object.fromEntries(result.scores.map((s) => [s.name, s.score]));
    expect(score.trigram).toBe(1);
    expect(score["first-order"]).toBeLessThan(1);
  });

  it("keeps the earlier candidate on a tie (two identical candidates score the same)", () => {
    const result = selectConfiguration(periodFour(12, 10), {}, { candidates: [{ name: "a", config: {} }, { name: "b", config: {} }], refinements: [] });
    expect(result.scores[0].score).toBe(result.scores[1].score);
    expect(result.chosen.name).toBe("a");
  });

  it("selects nothing when the caller fixes the transition model or asks for unlabelled learning", () => {
    expect(selectConfiguration(periodFour(12, 10), { order: 1 }).skipped).toMatch(/order/);
    expect(selectConfiguration(periodFour(12, 10), { semi: "em" }).skipped).toMatch(/first-order/);
    expect(selectConfiguration(periodFour(3, 10), {}).skipped).toMatch(/too few sentences/);
  });

  it("takes a refinement only when its per-fold gains pass the paired t-test", () => {
    // With the first-order model as the only candidate, the trigram structure as a refinement
    // gains on every one of the 3 folds of the period-four tags: taken. A refinement that changes
    // nothing gains 0 on every fold: not taken.
    const trigram = { order: 2 as const, prevWord: false, contextEmissions: false };
    const result = selectConfiguration(periodFour(12, 10), {}, {
      candidates: [{ name: "first-order", config: {} }],
      refinements: [
        { name: "nothing", config: {} },
        { name: "trigram", config: trigram },
      ],
    });
    expect(result.refinements.map((r) => [r.name, r.gains.length, r.taken])).toEqual([
      ["nothing", 3, false],
      ["trigram", 3, true],
    ]);
    expect(result.refinements[0]!.gains).toEqual([0, 0, 0]);
    expect(result.refinements[1]!.gains.every((g) => g > 0)).toBe(true);
    expect(result.chosen).toEqual({ name: "first-order + trigram", config: trigram });
    // The caller's own perceptron settings leave no refinement to try.
    expect(selectConfiguration(periodFour(12, 10), { perceptron: 1, perceptronFeatures: "word-type" }, { refinements: [{ name: "trigram", config: trigram }] }).refinements).toEqual([]);
  });
});

describe("pairedGainTest", () => {
  // One-sided paired t-test (any statistics text, e.g. Dietterich 1998 §3.4 for CV folds), worked
  // by hand: gains 0.01, 0.02, 0.03 have mean 0.02 and standard deviation 0.01, so
  // t = 0.02 / (0.01 / √3) = 3.4641 ≥ 2.920 (2 degrees of freedom, 5%): passes. Gains 0.03, −0.01,
  // 0.01: mean 0.01, standard deviation 0.02, t = 0.8660: fails.
  it("computes t from the mean and standard deviation of the gains and compares it with Student's quantile", () => {
    const pass = pairedGainTest([0.01, 0.02, 0.03]);
    expect(pass.mean).toBeCloseTo(0.02, 12);
    expect(pass.t).toBeCloseTo(3.4641016, 6);
    expect(pass.threshold).toBe(2.92);
    expect(pass.passes).toBe(true);
    const fail = pairedGainTest([0.03, -0.01, 0.01]);
    expect(fail.t).toBeCloseTo(0.8660254, 6);
    expect(fail.passes).toBe(false);
    // 5 folds: 4 degrees of freedom, quantile 2.132.
    expect(pairedGainTest([0.01, 0.02, 0.03, 0.02, 0.01]).threshold).toBe(2.132);
    expect(pairedGainTest([0.02]).passes).toBe(false);
    expect(pairedGainTest([-0.01, -0.01, -0.01]).passes).toBe(false);
  });
});
