import { describe, expect, it } from "vitest";
import { createRng } from "./random";

describe("createRng", () => {
  it("repeats its stream for the same seed and differs for another", () => {
    const a = createRng(42);
    const b = createRng(42);
    const c = createRng(43);
    const sa = Array.from({ length: 20 }, () => a.next());
    const sb = Array.from({ length: 20 }, () => b.next());
    const sc = Array.from({ length: 20 }, () => c.next());
    expect(sa).toEqual(sb);
    expect(sa).not.toEqual(sc);
  });

  it("is close to uniform on [0,1): mean 1/2 and variance 1/12 within 4 standard errors", () => {
    // Uniform(0,1) has mean 1/2 and variance 1/12 (any probability text, e.g. Ross, A First
    // Course in Probability, 9th ed., §5.3). Standard error of the mean: sqrt(1/12/n).
    const rng = createRng(7);
    const n = 200_000;
    let sum = 0;
    let sumSq = 0;
    for (let i = 0; i < n; i++) {
      const x = rng.next();
      expect(x >= 0 && x < 1).toBe(true);
      sum += x;
      sumSq += x * x;
    }
    const mean = sum / n;
    const variance = sumSq / n - mean * mean;
    expect(Math.abs(mean - 0.5)).toBeLessThan(4 * Math.sqrt(1 / 12 / n));
    expect(Math.abs(variance - 1 / 12)).toBeLessThan(0.002);
  });

  it("nextInt covers every value of a small range about equally (chi-square, 9 df)", () => {
    // Chi-square critical value for 9 degrees of freedom at p = 0.001 is 27.88
    // (NIST/SEMATECH e-Handbook of Statistical Methods, §1.3.6.7.4, table of upper critical values).
    const rng = createRng(2024);
    const counts = new Array<number>(10).fill(0);
    const n = 100_000;
    for (let i = 0; i < n; i++) counts[rng.nextInt(10)]! += 1;
    const expected = n / 10;
    const chi2 = counts.reduce((s, c) => s + ((c - expected) ** 2) / expected, 0);
    expect(chi2).toBeLessThan(27.88);
  });
});
