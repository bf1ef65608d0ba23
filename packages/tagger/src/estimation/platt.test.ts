import { describe, expect, it } from "vitest";
import { expectedCalibrationError } from "../metrics/calibration";
import { createRng } from "../util/random";
import { applyPlatt, confidenceLogit, fitPlatt } from "./platt";

describe("fitPlatt", () => {
  it("recovers a known sigmoid from synthetic outcomes and removes the miscalibration", () => {
    // Synthetic data with known probabilities: the true P(correct) is σ(2·logit(p) − 0.5), so the
    // maximum-likelihood fit (Platt 1999 §2.1) must land near a = 2, b = −0.5.
    const seed = 99;
    const rng = createRng(seed);
    const n = 20000;
    const p = Float64Array.from({ length: n }, () => 0.02 + 0.96 * rng.next());
    const truth = Array.from(p, (x) => 1 / (1 + Math.exp(-(2 * confidenceLogit(x) - 0.5))));
    const correct = truth.map((q) => rng.next() < q);
    const fit = fitPlatt(p, correct);
    expect(fit.a, `seed ${seed}`).toBeCloseTo(2, 1);
    expect(fit.b, `seed ${seed}`).toBeCloseTo(-0.5, 1);
    const before = expectedCalibrationError(p, correct).ece;
    const after = expectedCalibrationError(Array.from(p, (x) => applyPlatt(fit, x)), correct).ece;
    expect(before).toBeGreaterThan(0.05);
    expect(after, `seed ${seed}`).toBeLessThan(0.02);
  });

  it("keeps calibrated confidences nearly unchanged (a ≈ 1, b ≈ 0) and a = 1, b = 0 is the identity", () => {
    const seed = 7;
    const rng = createRng(seed);
    const p = Float64Array.from({ length: 20000 }, () => 0.02 + 0.96 * rng.next());
    const fit = fitPlatt(p, Array.from(p, (x) => rng.next() < x));
    expect(fit.a, `seed ${seed}`).toBeCloseTo(1, 1);
    expect(fit.b, `seed ${seed}`).toBeCloseTo(0, 1);
    expect(applyPlatt({ method: "platt", a: 1, b: 0, c: 0 }, 0.3, 4)).toBeCloseTo(0.3, 12);
  });

  it("stays finite when every outcome is the same (Platt's target smoothing)", () => {
    const fit = fitPlatt([0.9, 0.8, 1, 1], [true, true, true, true]);
    expect(Number.isFinite(fit.a) && Number.isFinite(fit.b)).toBe(true);
    expect(() => fitPlatt([], [])).toThrow(RangeError);
  });

  it("with span lengths, recovers a known three-input sigmoid (logit, 1, ln length) from synthetic outcomes", () => {
    // Synthetic data with known probabilities: P(correct) = σ(0.7·logit(p) − 0.3 − 0.8·ln(length)),
    // lengths 1–6 tokens; the maximum-likelihood fit must land near (0.7, −0.3, −0.8) and the fitted
    // map must give the true probability within 0.03 everywhere on the grid.
    const seed = 12;
    const rng = createRng(seed);
    const n = 30000;
    const p = Float64Array.from({ length: n }, () => 0.02 + 0.96 * rng.next());
    const lengths = Array.from({ length: n }, () => 1 + rng.nextInt(6));
    const truth = (x: number, length: number) => 1 / (1 + Math.exp(-(0.7 * confidenceLogit(x) - 0.3 - 0.8 * Math.log(length))));
    const correct = Array.from(p, (x, i) => rng.next() < truth(x, lengths[i]));
    const fit = fitPlatt(p, correct, lengths);
    expect(fit.a, `seed ${seed}`).toBeCloseTo(0.7, 1);
    expect(fit.b, `seed ${seed}`).toBeCloseTo(-0.3, 1);
    expect(fit.c, `seed ${seed}`).toBeCloseTo(-0.8, 1);
    for (const x of [0.1, 0.3, 0.5, 0.7, 0.9]) for (const length of [1, 2, 4, 6]) expect(Math.abs(applyPlatt(fit, x, length) - truth(x, length)), `seed ${seed} p ${x} length ${length}`).toBeLessThan(0.03);
    // Plain Platt (no lengths) cannot express the length effect: long spans stay over-confident.
    const plain = fitPlatt(p, correct);
    expect(plain.c).toBe(0);
    expect(Math.abs(applyPlatt(plain, 0.9, 6) - truth(0.9, 6))).toBeGreaterThan(0.1);
    expect(() => fitPlatt([0.5], [true], [0])).toThrow(RangeError);
    expect(() => fitPlatt([0.5], [true], [1, 2])).toThrow(RangeError);
  });
});
