import { describe, expect, it } from "vitest";
import { trainTagger } from "./tagger";
import { tinyDocuments } from "../testing/tiny-corpus";
import { documentUncertainty } from "./uncertainty";

describe("documentUncertainty", () => {
  const { model } = trainTagger(tinyDocuments);
  const familiar = [["Taven", "Orrick", "lives", "in", "Velmora", "."]];
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

  it("matches token entropy and least confidence worked by hand on a two-tag model", () => {
    // Model counted by hand from two sentences, "a b"/B-X O and "b"/O, in the NLTK-compatible
    // configuration with Lidstone γ = 1 (NLTK's HiddenMarkovModelTrainer.train_supervised with
    // LidstoneProbDist: (n + γ)/(total + γ·bins), transitions counted only from tokens that have a
    // successor, no end state): π(B-X) = π(O) = 2/4; B-X→B-X 1/3, B-X→O 2/3; O was never followed,
    // so O→B-X = O→O = 1/2; P(a|B-X) = 2/3, P(b|B-X) = 1/3; P(a|O) = 1/4, P(b|O) = 3/4.
    // "a b": paths B-X B-X = 1/2·2/3·1/3·1/3 = 64/1728, B-X O = 1/2·2/3·2/3·3/4 = 288/1728,
    // O B-X = 1/2·1/4·1/2·1/3 = 36/1728, O O = 1/2·1/4·1/2·3/4 = 81/1728; total 469/1728.
    // Posteriors P(B-X) = 352/469 at token 1 and 100/469 at token 2; the best path B-X O has
    // P = 288/469, so least confidence (Culotta & McCallum 2005) is 1 − 288/469 = 181/469.
    // "b": B-X 1/2·1/3 = 4/24, O 1/2·3/4 = 9/24 → posteriors 4/13, 9/13; least confidence 4/13.
    // Token entropy (Settles & Craven 2008) of a two-way posterior p: −p ln p − (1−p) ln(1−p).
    const docs = [{ sentences: [{ words: ["a", "b"], tags: ["B-X", "O"] }, { words: ["b"], tags: ["O"] }] }];
    const { model: small } = trainTagger(docs, { nltkCompatible: true, smoothing: { start: 1, transition: 1, emission: 1 } });
    const h = (p: number) => -p * Math.log(p) - (1 - p) * Math.log(1 - p);
    const one = documentUncertainty(small, [["a", "b"]]);
    expect(one.tokens).toBe(2);
    expect(one.meanEntropy).toBeCloseTo((h(352 / 469) + h(100 / 469)) / 2, 12);
    expect(one.leastConfidence).toBeCloseTo(181 / 469, 12);
    // Entropy is averaged over tokens, least confidence over sentences.
    const two = documentUncertainty(small, [["a", "b"], [], ["b"]]);
    expect(two.tokens).toBe(3);
    expect(two.meanEntropy).toBeCloseTo((h(352 / 469) + h(100 / 469) + h(4 / 13)) / 3, 12);
    expect(two.leastConfidence).toBeCloseTo((181 / 469 + 4 / 13) / 2, 12);
  });
});
