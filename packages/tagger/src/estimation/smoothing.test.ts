import { describe, expect, it } from "vitest";
import { estimateAddLambda, interpolateWittenBell, shrinkTowardParent } from "./smoothing";

describe("estimateAddLambda (Chen & Goodman 1998 §2.1; Manning & Schütze 1999 ch. 6)", () => {
  it("computes (n(a,b)+λ)/(n(a)+λ|B|) with |B| = number of columns and n(a) = the row's total count", () => {
    // Row 0: counts 3, 1, 0 → n(a) = 4, |B| = 3, λ = 0.5 → 3.5/5.5, 1.5/5.5, 0.5/5.5.
    const { table } = estimateAddLambda(Float64Array.from([3, 1, 0, 0, 0, 0]), 2, 3, 0.5);
    expect(Array.from(table.subarray(0, 3), Math.exp)).toEqual([3.5 / 5.5, 1.5 / 5.5, 0.5 / 5.5].map((x) => expect.closeTo(x, 15)));
    // Row 1 has no counts: λ alone gives the uniform distribution.
    expect(Array.from(table.subarray(3), Math.exp)).toEqual([1 / 3, 1 / 3, 1 / 3].map((x) => expect.closeTo(x, 15)));
  });

  it("λ = 1 is Laplace; per-cell pseudo-counts of 0 forbid a cell without data", () => {
    const laplace = estimateAddLambda(Float64Array.from([2, 0]), 1, 2, 1).table;
    expect(Math.exp(laplace[0])).toBeCloseTo(3 / 4, 15);
    const prior = Float64Array.from([1, 0]);
    const forbidden = estimateAddLambda(Float64Array.from([2, 0]), 1, 2, prior).table;
    expect(forbidden[1]).toBe(-Infinity);
    expect(Math.exp(forbidden[0])).toBe(1);
  });

  it("an extra outcome (end state) shares the row's mass: the C+1 probabilities sum to 1", () => {
    const { table, extra } = estimateAddLambda(Float64Array.from([3, 1]), 1, 2, 0.5, { counts: Float64Array.from([2]), prior: 0.5 });
    // n(a) = 3 + 1 + 2 = 6, |B| = 3 → 3.5/7.5, 1.5/7.5, end 2.5/7.5.
    expect(Math.exp(table[0])).toBeCloseTo(3.5 / 7.5, 15);
    expect(Math.exp(extra![0])).toBeCloseTo(2.5 / 7.5, 15);
    expect(Math.exp(table[0]) + Math.exp(table[1]) + Math.exp(extra![0])).toBeCloseTo(1, 15);
  });
});

describe("shrinkTowardParent (MacKay & Peto 1995, \"A hierarchical Dirichlet language model\")", () => {
  it("returns the parent without data and (n(c)+β·parent(c))/(n+β) with data", () => {
    // MacKay & Peto (1995), "A hierarchical Dirichlet language model", Natural Language
    // Engineering 1(3): the predictive distribution (F_{i|j} + α·m_i)/(F_j + α) of a Dirichlet
    // prior with mean m and concentration α (§3; section number from memory). Worked by hand:
    // parent (1/4, 3/4), β = 10; no data → the parent; counts 6, 4 → (6 + 2.5)/20.
    const parent = Float64Array.from([0.25, 0.75].map(Math.log));
    const out = new Float64Array(2);
    shrinkTowardParent(new Float64Array(2), 0, 2, 10, parent, 0, out, 0);
    expect(Array.from(out, Math.exp)).toEqual([expect.closeTo(0.25, 15), expect.closeTo(0.75, 15)]);
    shrinkTowardParent(Float64Array.from([6, 4]), 0, 2, 10, parent, 0, out, 0);
    expect(Math.exp(out[0])).toBeCloseTo((6 + 2.5) / 20, 15);
  });
});

describe("interpolateWittenBell (Witten & Bell 1991, \"The Zero-Frequency Problem\")", () => {
  it("gives (n(c) + u·backoff(c))/(n+u) with u distinct outcomes, and sums to 1", () => {
    // Witten & Bell (1991), "The Zero-Frequency Problem: Estimating the Probabilities of Novel
    // Events in Adaptive Text Compression", IEEE Trans. Information Theory 37(4), method C: after
    // n events with u distinct ones, a novel event has probability u/(n+u); interpolated with a
    // back-off distribution as in Chen & Goodman (1998), "An Empirical Study of Smoothing
    // Techniques for Language Modeling", §2.5 (method letter and section from memory). Worked by
    // hand below.
    const backoff = Float64Array.from([0.5, 0.3, 0.2].map(Math.log));
    const out = new Float64Array(3);
    // Context seen 4 times: outcome 0 three times, outcome 2 once → n = 4, u = 2.
    interpolateWittenBell(Int32Array.from([0, 2]), Float64Array.from([3, 1]), 0, 2, backoff, 0, 3, out, 0);
    expect(Math.exp(out[0])).toBeCloseTo((3 + 2 * 0.5) / 6, 15);
    expect(Math.exp(out[1])).toBeCloseTo((2 * 0.3) / 6, 15);
    expect(Math.exp(out[2])).toBeCloseTo((1 + 2 * 0.2) / 6, 15);
    expect(out.reduce((a, v) => a + Math.exp(v), 0)).toBeCloseTo(1, 15);
  });
});
