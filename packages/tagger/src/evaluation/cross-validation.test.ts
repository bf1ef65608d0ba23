import { describe, expect, it } from "vitest";
import { crossValidate, planFolds } from "./cross-validation";
import { tagDocument, trainTagger } from "../model/tagger";
import { tinyDocuments } from "../testing/tiny-corpus";
import { evaluateModel } from "./evaluation";
import { expectedCalibrationError } from "../metrics/calibration";

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

  it("reports every fold and the mean and sample standard deviation, pinned by hand", () => {
    // Three documents of one-word sentences: 6 × "w"/B-X and 6 × "v"/O in each, plus label noise in
    // two of them. Whichever two train, "w" is B-X and "v" is O by a wide margin, so each held-out
    // fold is tagged w → B-X, v → O (checked below) and its scores can be counted by hand (CoNLL
    // convention; each B-X token is one chunk):
    //   fold 0, no noise: 6 gold, 6 found, 6 correct → P = R = F1 = 1, accuracy 12/12;
    //   fold 1, + w/O + v/B-X: 7 gold, 7 found, 6 correct → P = R = F1 = 6/7, accuracy 12/14;
    //   fold 2, + 3 × w/O: 6 gold, 9 found, 6 correct → P = 2/3, R = 1, F1 = 4/5, accuracy 12/15.
    // Mean and sample standard deviation (n − 1 in the denominator; common practice), by hand:
    //   F1 1, 6/7, 4/5: mean 31/35, deviations 4/35, −1/35, −3/35 → sd = √(26/2)/35 = √13/35;
    //   P 1, 6/7, 2/3: mean 53/63, deviations 10/63, 1/63, −11/63 → sd = √(222/2)/63 = √111/63;
    //   R 1, 6/7, 1: mean 20/21, deviations 1/21, −2/21, 1/21 → sd = √(6/2)/21 = √3/21.
    const s = (word: string, tag: string) => ({ words: [word], tags: [tag] });
    const clean = [...Array.from({ length: 6 }, () => s("w", "B-X")), ...Array.from({ length: 6 }, () => s("v", "O"))];
    const docs = [
      { sentences: [...clean] },
      { sentences: [...clean, s("w", "O"), s("v", "B-X")] },
      { sentences: [...clean, s("w", "O"), s("w", "O"), s("w", "O")] },
    ];
    for (let f = 0; f < 3; f++) {
      const { model } = trainTagger(docs.filter((_, g) => g !== f));
      expect(tagDocument(model, [["w"], ["v"]]), `fold ${f}`).toEqual([["B-X"], ["O"]]);
    }
    const result = crossValidate(docs, {}, 3);
    expect(result.unit).toBe("documents");
    const folds = result.folds.map((x) => [x.precision, x.recall, x.f1, x.tokenAccuracy, x.tokens]);
    const expected = [[1, 1, 1, 1, 12], [6 / 7, 6 / 7, 6 / 7, 12 / 14, 14], [2 / 3, 1, 4 / 5, 12 / 15, 15]];
    folds.forEach((row, f) => row.forEach((v, j) => expect(v, `fold ${f} column ${j}`).toBeCloseTo(expected[f][j], 12)));
    expect(result.f1!.mean).toBeCloseTo(31 / 35, 12);
    expect(result.f1!.std).toBeCloseTo(Math.sqrt(13) / 35, 12);
    expect(result.precision!.mean).toBeCloseTo(53 / 63, 12);
    expect(result.precision!.std).toBeCloseTo(Math.sqrt(111) / 63, 12);
    expect(result.recall!.mean).toBeCloseTo(20 / 21, 12);
    expect(result.recall!.std).toBeCloseTo(Math.sqrt(3) / 21, 12);
    expect(result.tokenAccuracy.mean).toBeCloseTo(31 / 35, 12);
    expect(result.tokenAccuracy.std).toBeCloseTo(Math.sqrt(13) / 35, 12);
  });

  it("pools the held-out span confidences of every fold into one calibration error", () => {
    // Invariant: the pooled ECE is expectedCalibrationError over the spans of each fold's model
    // on its held-out documents, concatenated (Guo et al. 2017 §2 eq. 3 over all predictions).
    const plan = planFolds(tinyDocuments, 3);
    const confidences: number[] = [];
    const correct: boolean[] = [];
    plan.folds.forEach((heldOut, f) => {
      const { model } = trainTagger(plan.folds.filter((_, g) => g !== f).flat());
      for (const span of evaluateModel(model, heldOut, { confidences: true }).spans!) {
        confidences.push(span.confidence);
        correct.push(span.correct);
      }
    });
    const result = crossValidate(tinyDocuments, {}, 3, { confidences: true });
    expect(confidences.length).toBeGreaterThan(0);
    expect(result.spanCalibrationError).toEqual({ ece: expectedCalibrationError(confidences, correct).ece, spans: confidences.length });
    expect(crossValidate(tinyDocuments, {}, 3).spanCalibrationError).toBeNull();
  });
});
