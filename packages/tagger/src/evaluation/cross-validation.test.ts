import { describe, expect, it } from "vitest";
import { crossValidate, planFolds } from "./cross-validation";
import { tinyDocuments } from "../testing/tiny-corpus";

describe("planFolds / crossValidate", () => {
  it("splits documents into contiguous folds that cover every document once", () => {
    const docs = Array.from({ length: 7 }, (_, d) => ({ sentences: [{ words: [`w${d}`], tags: ["O"] }] }));
    const { unit, folds } = planFolds(docs, 3);
    expect(unit).toBe("documents");
    expect(folds.map((f) => f.map((d) => d.sentences[0].words[0]))).toEqual([["w0", "w1"], ["w2", "w3"], ["w4", "w5", "w6"]]);
  });

  it("falls back to contiguous sentence blocks when there are fewer documents than folds", () => {
    const { unit, folds } = planFolds(tinyDocuments.slice(0, 1), 3);
    expect(unit).toBe("sentence-blocks");
    expect(folds.flat().flatMap((d) => d.sentences)).toEqual(tinyDocuments[0].sentences);
    expect(() => planFolds(tinyDocuments, 1)).toThrow(/folds must be an integer ≥ 2/);
  });

  it("reports every fold and the mean and spread", () => {
    const result = crossValidate(tinyDocuments, {}, 3);
    expect(result.folds).toHaveLength(3);
    const mean = result.folds.reduce((a, f) => a + f.f1!, 0) / 3;
    expect(result.f1!.mean).toBeCloseTo(mean, 12);
    expect(result.f1!.std).toBeGreaterThanOrEqual(0);
    expect(result.tokenAccuracy.mean).toBeGreaterThan(0.5);
  });
});
