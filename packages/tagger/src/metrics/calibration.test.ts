import { describe, expect, it } from "vitest";
import { createRng } from "../util/random";
import { expectedCalibrationError } from "./calibration";

describe("expectedCalibrationError", () => {
  it("matches a hand-worked example", () => {
    // Worked by hand from Guo et al. (2017) eq. 3 with 10 bins:
    // bin (0.8, 0.9]: 0.85, 0.85 (1 of 2 right): |0.5 − 0.85| = 0.35, weight 2/5;
    // bin (0.1, 0.2]: 0.2 (wrong): |0 − 0.2| = 0.2, weight 1/5;
    // bin (0.9, 1]: 1, 1 (both right): 0, weight 2/5. ECE = 0.14 + 0.04 = 0.18.
    const report = expectedCalibrationError([0.85, 0.85, 0.2, 1, 1], [true, false, false, true, true]);
    expect(report.ece).toBeCloseTo(0.18, 12);
    expect(report.bins[1].count).toBe(1);
    expect(report.bins[8].count).toBe(2);
    expect(report.bins[9].count).toBe(2);
  });

  it("is near 0 for outcomes drawn with the stated probabilities and near E[p − p²] = 1/6 when they are p²", () => {
    // Synthetic data with known probabilities: confidence p ~ U(0, 1); outcome ~ Bernoulli(p)
    // (calibrated) or Bernoulli(p²) (overconfident, expected gap ∫(p − p²)dp = 1/6 in every bin).
    const seed = 2026;
    const rng = createRng(seed);
    const n = 40000;
    const p = Float64Array.from({ length: n }, () => rng.next());
    const calibrated = Array.from(p, (x) => rng.next() < x);
    const overconfident = Array.from(p, (x) => rng.next() < x * x);
    expect(expectedCalibrationError(p, calibrated).ece, `seed ${seed}`).toBeLessThan(0.015);
    expect(expectedCalibrationError(p, overconfident).ece, `seed ${seed}`).toBeCloseTo(1 / 6, 1);
  });

  it("rejects confidences outside [0, 1] and mismatched lengths", () => {
    expect(() => expectedCalibrationError([1.5], [true])).toThrow(RangeError);
    expect(() => expectedCalibrationError([0.5], [])).toThrow(RangeError);
  });
});
