import { describe, expect, it } from "vitest";
import { computeAgreement } from "./agreement";

// One-character tokens at even offsets: token i is [2i, 2i+1).
const tokens = (n: number) => Array.from({ length: n }, (_, i) => ({ start: 2 * i, end: 2 * i + 1 }));
const span = (fromToken: number, toToken: number, type: string) => ({ start: 2 * fromToken, end: 2 * (toToken - 1) + 1, type });

describe("computeAgreement", () => {
  it("exact match, partial overlap and type mismatch (worked by hand)", () => {
    // A: PER[0,2) LOC[3,4) ORG[6,7); B: PER[0,2) LOC[2,4) PER[6,7): one exact match, one partial
    // overlap (no match), one type mismatch (no match): matched 1, onlyA 2, onlyB 2, F1 = 2/6.
    const doc = {
      tokens: tokens(10),
      byAnnotator: new Map([
        ["a", [span(0, 2, "PER"), span(3, 4, "LOC"), span(6, 7, "ORG")]],
        ["b", [span(0, 2, "PER"), span(2, 4, "LOC"), span(6, 7, "PER")]],
      ]),
    };
    const { pairs, overall } = computeAgreement([doc]);
    expect(pairs).toHaveLength(1);
    expect(pairs[0]).toMatchObject({ annotatorA: "a", annotatorB: "b", documents: 1, tokens: 10, matched: 1, onlyA: 2, onlyB: 2 });
    expect(pairs[0]!.f1).toBeCloseTo(1 / 3, 12);
    // Token labels, worked by hand: A = B-PER I-PER O B-LOC O O B-ORG O O O,
    // B = B-PER I-PER B-LOC I-LOC O O B-PER O O O. They differ at tokens 2, 3 and 6: po = 0.7.
    // A's labels: B-PER 1, I-PER 1, B-LOC 1, B-ORG 1, O 6; B's: B-PER 2, I-PER 1, B-LOC 1, I-LOC 1, O 5.
    // pe = (1·2 + 1·1 + 1·1 + 6·5)/100 = 0.34; κ = (0.7 − 0.34)/(1 − 0.34) = 0.36/0.66.
    expect(pairs[0]!.kappa).toBeCloseTo(0.36 / 0.66, 12);
    expect(overall).toMatchObject({ documents: 1 });
    expect(overall!.f1).toBeCloseTo(1 / 3, 12);
  });

  it("pools token labels over documents: reproduces Wikipedia's worked example (κ = 0.4)", () => {
    // Wikipedia, "Cohen's kappa", section Examples, "Simple example": 50 items, both yes 20,
    // A yes/B no 5, A no/B yes 10, both no 15 → po = 0.7, pe = 0.5, κ = 0.4. Here "yes" is a
    // one-token span (label B-X) and "no" is O, spread over two documents of 25 tokens.
    const both = (n: number, offset: number) => Array.from({ length: n }, (_, i) => span(offset + i, offset + i + 1, "X"));
    const doc1 = { tokens: tokens(25), byAnnotator: new Map([["a", both(20, 0)], ["b", both(20, 0)]]) };
    const doc2 = { tokens: tokens(25), byAnnotator: new Map([["a", both(5, 0)], ["b", both(10, 5)]]) };
    const { pairs, overall } = computeAgreement([doc1, doc2]);
    expect(pairs[0]!.tokens).toBe(50);
    expect(pairs[0]!.kappa).toBeCloseTo(0.4, 12);
    expect(overall!.kappa).toBeCloseTo(0.4, 12);
    // Entities: 20 matched, A alone 5, B alone 10: F1 = 40/55 (worked by hand).
    expect(pairs[0]!.f1).toBeCloseTo(40 / 55, 12);
  });

  it("gives every pair of three annotators and skips documents with one annotator", () => {
    const doc = {
      tokens: tokens(4),
      byAnnotator: new Map([
        ["c", [span(0, 1, "X")]],
        ["a", [span(0, 1, "X")]],
        ["b", []],
      ]),
    };
    const lonely = { tokens: tokens(4), byAnnotator: new Map([["a", [span(2, 3, "X")]]]) };
    const { pairs, overall } = computeAgreement([doc, lonely]);
    expect(pairs.map((p) => `${p.annotatorA}-${p.annotatorB}`)).toEqual(["a-b", "a-c", "b-c"]);
    expect(pairs.find((p) => p.annotatorB === "c" && p.annotatorA === "a")!.f1).toBe(1);
    expect(pairs.find((p) => p.annotatorA === "a" && p.annotatorB === "b")!.f1).toBe(0);
    expect(overall!.documents).toBe(1);
  });

  it("has no figures without a document two annotators finished", () => {
    expect(computeAgreement([])).toEqual({ pairs: [], overall: null });
  });
});
