import { describe, expect, it } from "vitest";
import { tagSentence, trainTagger } from "./tagger";
import { tinyDocuments } from "../testing/tiny-corpus";
import { documentUncertainty } from "./uncertainty";
import { sentencePosteriors, decodeSentence } from "./decode";

describe("documentUncertainty", () => {
  const { model } = trainTagger(tinyDocuments);
  const familiar = [["John", "Smith", "lives", "in", "Paris", "."]];
  const strange = [["Qwerty", "Zxcv", "Asdf", "Uiop", "Hjkl"]];

  it("is deterministic, bounded, and higher for unfamiliar text", () => {
    const a = documentUncertainty(model, strange);
    expect(documentUncertainty(model, strange)).toEqual(a);
    const b = documentUncertainty(model, familiar);
    expect(a.meanEntropy).toBeGreaterThan(b.meanEntropy);
    expect(a.leastConfidence).toBeGreaterThan(b.leastConfidence);
    for (const u of [a, b]) {
      expect(u.meanEntropy).toBeGreaterThanOrEqual(0);
      expect(u.meanEntropy).toBeLessThanOrEqual(Math.log(model.tags.length) + 1e-12);
      expect(u.leastConfidence).toBeGreaterThanOrEqual(0);
      expect(u.leastConfidence).toBeLessThanOrEqual(1);
    }
    expect(documentUncertainty(model, [[]])).toEqual({ meanEntropy: 0, leastConfidence: 0, tokens: 0 });
  });

  it("computes token entropy and 1 − P(Viterbi path | words) from the posteriors", () => {
    const words = familiar[0];
    const { posteriors, logLikelihood } = sentencePosteriors(model, words, 0);
    const K = model.tags.length;
    let h = 0;
    for (let x = 0; x < posteriors.length; x++) if (posteriors[x] > 0) h -= posteriors[x] * Math.log(posteriors[x]);
    const u = documentUncertainty(model, familiar);
    expect(u.tokens).toBe(words.length);
    expect(u.meanEntropy).toBeCloseTo(h / words.length, 12);
    expect(u.leastConfidence).toBeCloseTo(1 - Math.exp(decodeSentence(model, words, 0).logProbability - logLikelihood), 12);
    expect(K).toBeGreaterThan(1);
    expect(tagSentence(model, words).logLikelihood).toBeCloseTo(logLikelihood, 12);
  });
});
