import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { tagsToChunks, toIob2 } from "../text/bio";
import { computePrf, scoreEntities, tokenAccuracy } from "./entity-scores";

describe("scoreEntities", () => {
  it("matches the seqeval README example", () => {
    // seqeval README (github.com/chakki-works/seqeval, 1.x), section "Usage", classification_report
    // and accuracy_score; as REFERENCES.md "check 2": MISC P=R=F1=0 (support 1), PER 1 (support 1),
    // micro P=R=F1=0.50, token accuracy 0.80.
    const gold = [["O", "O", "O", "B-MISC", "I-MISC", "I-MISC", "O"], ["B-PER", "I-PER", "O"]];
    const predicted = [["O", "O", "B-MISC", "I-MISC", "I-MISC", "I-MISC", "O"], ["B-PER", "I-PER", "O"]];
    const scores = scoreEntities(gold, predicted);
    expect(scores.overall).toEqual({ precision: 0.5, recall: 0.5, f1: 0.5, correct: 1, predicted: 2, gold: 2 });
    expect(scores.types).toEqual({
      MISC: { precision: 0, recall: 0, f1: 0, support: 1, correct: 0, predicted: 1 },
      PER: { precision: 1, recall: 1, f1: 1, support: 1, correct: 1, predicted: 1 },
    });
    expect(scores.tokenAccuracy).toBeCloseTo(0.8, 12);
    expect(scores.tokens).toBe(10);
    expect(scores.sentences).toBe(2);
  });

  it("matches conlleval on the edge cases of REFERENCES.md check 3", () => {
    // REFERENCES.md "Scoring: the CoNLL convention", check 3 (computed there with the conlleval
    // script, 2004 version): 18 tokens, 8 gold, 8 found, 4 correct, P=R=F1=50.00, accuracy 66.67;
    // per type P/R/F1: LOC 50/50/50, MISC 100/100/100, ORG 0/0/0, PER 50/50/50.
    const gold = [["B-PER", "I-PER", "O", "B-LOC"], ["B-ORG", "I-ORG", "I-ORG", "O"], ["B-PER", "B-PER", "O"], ["O", "B-MISC", "I-MISC"], ["B-LOC", "O", "O"], ["I-PER"]];
    const predicted = [["B-PER", "I-PER", "O", "I-LOC"], ["B-ORG", "I-ORG", "I-LOC", "O"], ["B-PER", "I-PER", "O"], ["O", "B-MISC", "I-MISC"], ["O", "O", "B-PER"], ["B-PER"]];
    const scores = scoreEntities(gold, predicted);
    expect(scores.tokens).toBe(18);
    expect(scores.overall).toMatchObject({ gold: 8, predicted: 8, correct: 4 });
    expect(scores.overall.precision * 100).toBeCloseTo(50.0, 2);
    expect(scores.overall.recall * 100).toBeCloseTo(50.0, 2);
    expect(scores.overall.f1 * 100).toBeCloseTo(50.0, 2);
    expect(scores.tokenAccuracy * 100).toBeCloseTo(66.67, 2);
    const printed: Record<string, [number, number, number]> = { LOC: [50, 50, 50], MISC: [100, 100, 100], ORG: [0, 0, 0], PER: [50, 50, 50] };
    expect(Object.keys(scores.types)).toEqual(["LOC", "MISC", "ORG", "PER"]);
    for (const [type, [p, r, f]] of Object.entries(printed)) {
      expect(scores.types[type].precision * 100).toBeCloseTo(p, 2);
      expect(scores.types[type].recall * 100).toBeCloseTo(r, 2);
      expect(scores.types[type].f1 * 100).toBeCloseTo(f, 2);
    }
    // Supports worked by hand from the sequences above: PER 4, LOC 2, ORG 1, MISC 1.
    expect([scores.types.PER.support, scores.types.LOC.support, scores.types.ORG.support, scores.types.MISC.support]).toEqual([4, 2, 1, 1]);
  });

  it("ends chunks at sentence boundaries", () => {
    // Worked by hand: joined into one sentence the two I-PER tokens would be one chunk in both; split,
    // gold has two PER chunks and the prediction (a B-PER then I-LOC) matches only the first.
    const scores = scoreEntities([["O", "I-PER"], ["I-PER", "O"]], [["O", "B-PER"], ["I-LOC", "O"]]);
    expect(scores.overall).toMatchObject({ gold: 2, predicted: 2, correct: 1 });
    expect(scores.types.LOC).toEqual({ precision: 0, recall: 0, f1: 0, support: 0, correct: 0, predicted: 1 });
  });

  it("gives 0 for every ratio with a zero denominator, and handles empty input", () => {
    // Convention stated for conlleval in REFERENCES.md: each ratio is 0 when its denominator is 0.
    expect(scoreEntities([["O", "O"]], [["O", "O"]]).overall).toEqual({ precision: 0, recall: 0, f1: 0, correct: 0, predicted: 0, gold: 0 });
    expect(scoreEntities([["B-X"]], [["O"]]).types.X).toEqual({ precision: 0, recall: 0, f1: 0, support: 1, correct: 0, predicted: 0 });
    expect(scoreEntities([], [])).toEqual({
      overall: { precision: 0, recall: 0, f1: 0, correct: 0, predicted: 0, gold: 0 },
      types: {},
      tokenAccuracy: 0,
      tokens: 0,
      sentences: 0,
    });
  });

  it("throws RangeError naming the sentence whose lengths differ, and on non-IOB tags", () => {
    expect(() => scoreEntities([["O"], ["O"]], [["O"]])).toThrow("gold has 2 sentences but predicted has 1");
    expect(() => scoreEntities([["O"], ["O", "O"]], [["O"], ["O"]])).toThrow("sentence 1: gold has 2 tags but predicted has 1");
    expect(() => scoreEntities([["O", "NN"]], [["O", "O"]])).toThrow('sentence 0 token 1: tag "NN" is not an IOB tag');
  });

  it("property: agrees with counting chunk sets from tagsToChunks, and IOB1 scores like its IOB2 form", () => {
    const sentence = fc.array(fc.constantFrom("O", "B-PER", "I-PER", "B-LOC", "I-LOC"), { maxLength: 12 });
    const pairs = fc.array(sentence.chain((g) => fc.tuple(fc.constant(g), fc.array(fc.constantFrom("O", "B-PER", "I-PER", "B-LOC", "I-LOC"), { minLength: g.length, maxLength: g.length }))), { maxLength: 8 });
    fc.assert(
      fc.property(pairs, (ps) => {
        const gold = ps.map((p) => p[0]);
        const predicted = ps.map((p) => p[1]);
        let correct = 0;
        let found = 0;
        let expectedGold = 0;
        for (let s = 0; s < gold.length; s++) {
          const g = tagsToChunks(gold[s]).map((c) => `${c.type}:${c.start}:${c.end}`);
          const p = new Set(tagsToChunks(predicted[s]).map((c) => `${c.type}:${c.start}:${c.end}`));
          correct += g.filter((k) => p.has(k)).length;
          found += p.size;
          expectedGold += g.length;
        }
        const scores = scoreEntities(gold, predicted);
        expect(scores.overall).toEqual({ ...computePrf(correct, found, expectedGold), correct, predicted: found, gold: expectedGold });
        expect(scoreEntities(gold.map(toIob2), predicted.map(toIob2)).overall).toEqual(scores.overall);
      }),
      { seed: 4101, numRuns: 300 },
    );
  });

  it("scores 100k tokens quickly", () => {
    const tags = ["B-PER", "I-PER", "O", "B-LOC", "O", "I-ORG", "I-ORG", "O"];
    const gold: string[][] = [];
    const predicted: string[][] = [];
    for (let s = 0; s < 5000; s++) {
      const g: string[] = [];
      const p: string[] = [];
      for (let i = 0; i < 20; i++) {
        g.push(tags[(s + i) % tags.length]);
        p.push(tags[(s * 3 + i) % tags.length]);
      }
      gold.push(g);
      predicted.push(p);
    }
    const started = performance.now();
    const scores = scoreEntities(gold, predicted);
    expect(performance.now() - started).toBeLessThan(1000);
    expect(scores.tokens).toBe(100_000);
  });
});

describe("computePrf", () => {
  it("is the harmonic mean of precision and recall", () => {
    // Worked by hand: P = 3/4, R = 3/5, F1 = 2·(3/4)(3/5)/(3/4 + 3/5) = 2/3.
    const prf = computePrf(3, 4, 5);
    expect(prf.precision).toBe(0.75);
    expect(prf.recall).toBe(0.6);
    expect(prf.f1).toBeCloseTo(2 / 3, 12);
  });
});

describe("tokenAccuracy", () => {
  it("counts whole-tag matches over any tag set", () => {
    // Worked by hand: 3 of 4 tags equal.
    expect(tokenAccuracy([["DT", "NN"], ["VBZ", "."]], [["DT", "NNS"], ["VBZ", "."]])).toBe(0.75);
    expect(tokenAccuracy([], [])).toBe(0);
    expect(() => tokenAccuracy([["O"]], [["O", "O"]])).toThrow(RangeError);
  });
});
