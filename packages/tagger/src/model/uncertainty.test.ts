import { describe, expect, it } from "vitest";
import { trainTagger } from "./tagger";
import { tinyDocuments } from "../testing/tiny-corpus";
import { documentUncertainty, uncertaintyMeasures } from "./uncertainty";

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
    const empty = uncertaintyMeasures(model, [[]]);
    expect(empty.tokens).toBe(0);
    for (const value of Object.values(empty)) expect(value).toBe(0);
    // The full measures repeat the product's three numbers exactly.
    for (const words of [familiar, strange]) {
      const full = uncertaintyMeasures(model, words);
      const { meanEntropy, leastConfidence, tokens } = full;
      expect({ meanEntropy, leastConfidence, tokens }).toEqual(documentUncertainty(model, words));
    }
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

  it("matches sequence entropy and the span measures worked by hand on the same two-tag model", () => {
    // Same model and sentences as above (hand counts from NLTK's Lidstone training, γ = 1).
    // Sequence entropy (Settles & Craven 2008 §3.1, computed exactly): −Σ over the four tag paths
    // of "a b" of P(path | words) ln P(path | words), with P = 64, 288, 36, 81 over 469.
    // The best tagging B-X O predicts one span X over "a"; with only B-X and O there is no I-X, so
    // its probability is P(B-X at token 1) = 352/469 (the model is NLTK-compatible: no
    // calibration), 1 − confidence = 117/469. Token 2 lies outside every span and an entity
    // begins there with P(B-X at token 2) = 100/469: the expected missed entities. Expected span
    // errors 117/469 + 100/469 = 217/469 over 2 tokens.
    const docs = [{ sentences: [{ words: ["a", "b"], tags: ["B-X", "O"] }, { words: ["b"], tags: ["O"] }] }];
    const { model: small } = trainTagger(docs, { nltkCompatible: true, smoothing: { start: 1, transition: 1, emission: 1 } });
    const pathEntropy = (counts: number[]) => {
      const z = counts.reduce((a, b) => a + b, 0);
      return -counts.reduce((h, n) => h + (n / z) * Math.log(n / z), 0);
    };
    const one = uncertaintyMeasures(small, [["a", "b"]]);
    expect(one.sequenceEntropy).toBeCloseTo(pathEntropy([64, 288, 36, 81]), 12);
    expect(one.spans).toBe(1);
    expect(one.spanUncertaintyMean).toBeCloseTo(117 / 469, 12);
    expect(one.spanUncertaintyMax).toBeCloseTo(117 / 469, 12);
    expect(one.missedEntities).toBeCloseTo(100 / 469, 12);
    expect(one.missedEntityMax).toBeCloseTo(100 / 469, 12);
    expect(one.expectedSpanErrors).toBeCloseTo(217 / 469, 12);
    expect(one.spanErrorDensity).toBeCloseTo(217 / 469 / 2, 12);
    // "b" alone: paths B-X (4/24) and O (9/24); the best tagging is O, so no span is predicted and
    // an entity begins at "b" with 4/13. Sums add over sentences, the density divides by 3 tokens.
    const two = uncertaintyMeasures(small, [["a", "b"], [], ["b"]]);
    expect(two.sequenceEntropy).toBeCloseTo(pathEntropy([64, 288, 36, 81]) + pathEntropy([4, 9]), 12);
    expect(two.totalEntropy).toBeCloseTo(3 * two.meanEntropy, 12);
    expect(two.leastConfidenceSum).toBeCloseTo(181 / 469 + 4 / 13, 12);
    expect(two.spans).toBe(1);
    expect(two.missedEntities).toBeCloseTo(100 / 469 + 4 / 13, 12);
    expect(two.missedEntityMax).toBeCloseTo(4 / 13, 12);
    expect(two.expectedSpanErrors).toBeCloseTo(117 / 469 + 100 / 469 + 4 / 13, 12);
    expect(two.spanErrorDensity).toBeCloseTo((117 / 469 + 100 / 469 + 4 / 13) / 3, 12);
  });

  it("gives the sequence entropy the token entropies bound from above on a trained model", () => {
    // Subadditivity of entropy, H(Y_1..Y_T) ≤ Σ_t H(Y_t) (Cover & Thomas, "Elements of Information
    // Theory", 2nd ed., Theorem 2.6.6), with equality only when the tags are independent.
    for (const words of [["Taven", "Orrick", "lives", "in", "Velmora", "."], ["Qwerty", "Zxcv", "Asdf", "Uiop", "Hjkl"]]) {
      const u = uncertaintyMeasures(model, [words]);
      expect(u.sequenceEntropy).toBeGreaterThanOrEqual(0);
      expect(u.sequenceEntropy!).toBeLessThanOrEqual(u.totalEntropy + 1e-9);
      expect(u.spanErrorDensity).toBeCloseTo(u.expectedSpanErrors / u.tokens, 12);
    }
    // A second-order model's posterior is a chain over tag pairs: no sequence entropy, the rest as usual.
    const { model: trigram } = trainTagger(tinyDocuments, { order: 2 });
    const u = uncertaintyMeasures(trigram, strange);
    expect(u.sequenceEntropy).toBeNull();
    expect(u.tokens).toBe(5);
    expect(u.meanEntropy).toBeGreaterThan(0);
    expect(u.expectedSpanErrors).toBeGreaterThan(0);
  });
});
