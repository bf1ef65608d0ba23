import { describe, expect, it } from "vitest";
import { createRng, type Rng } from "../util/random";
import { pairedBootstrap } from "./bootstrap";

// Tags for one sentence of n tokens with one single-token PER entity per listed position.
function sentenceWith(n: number, entities: readonly number[], type = "PER"): string[] {
  const tags = new Array<string>(n).fill("O");
  for (const i of entities) tags[i] = `B-${type}`;
  return tags;
}

describe("pairedBootstrap", () => {
  it("gives delta 0, CI [0, 0] and p = 1 for identical taggers", () => {
    const gold = [[sentenceWith(6, [0, 3])], [sentenceWith(5, [1])], [sentenceWith(4, [2])]];
    const a = [[sentenceWith(6, [0])], [sentenceWith(5, [1, 4])], [sentenceWith(4, [])]];
    const result = pairedBootstrap({ gold, a, b: a }, { rng: createRng(1) });
    expect(result.delta).toBe(0);
    expect(result.ci).toEqual([0, 0]);
    // The shifted test (Berg-Kirkpatrick, Burkett & Klein 2012, EMNLP, §2–3) counts delta* > 2·delta;
    // with delta = 0 there is no improvement to test, and p = 1 is our documented convention (common
    // practice; the literal count would be 0/1000 here, as delta* is always 0).
    expect(result.pValue).toBe(1);
    expect(result.samples).toBe(1000);
    // Worked by hand: A finds 2 of 4 gold entities with 3 predictions: P 2/3, R 1/2, F1 4/7.
    expect(result.f1A).toBeCloseTo(4 / 7, 12);
    expect(result.f1B).toBe(result.f1A);
  });

  it("matches the exact resampling distribution of two documents", () => {
    // Worked by hand. Document 1: 2 gold entities; A finds 1 (1 prediction), B finds both.
    // Document 2: 2 gold entities; A finds both, B finds both plus 1 false one.
    // Whole set: F1(A) = 6/7 (c3 p3 g4), F1(B) = 8/9 (c4 p5 g4), delta = 2/63.
    // Resamples: {1,1} (prob 1/4): F1 2/3 vs 1, delta* = 1/3 > 2·delta.
    //            {2,2} (prob 1/4): F1 1 vs 0.8, delta* = −0.2.
    //            {1,2} (prob 1/2): the test set itself, delta* = delta, not > 2·delta.
    // So p = 1/4 exactly in the limit, and the 95% percentile interval is [−0.2, 1/3].
    const gold = [[sentenceWith(4, [0, 2])], [sentenceWith(4, [1, 3])]];
    const a = [[sentenceWith(4, [0])], [sentenceWith(4, [1, 3])]];
    const b = [[sentenceWith(4, [0, 2])], [sentenceWith(4, [0, 1, 3])]];
    const samples = 4000;
    const result = pairedBootstrap({ gold, a, b }, { rng: createRng(7), samples });
    expect(result.f1A).toBeCloseTo(6 / 7, 12);
    expect(result.f1B).toBeCloseTo(8 / 9, 12);
    expect(result.delta).toBeCloseTo(2 / 63, 12);
    // Binomial standard error of a proportion 1/4 over 4000 samples is 0.0068; allow 4 of them.
    expect(Math.abs(result.pValue - 0.25)).toBeLessThan(4 * Math.sqrt((0.25 * 0.75) / samples));
    expect(result.ci[0]).toBeCloseTo(-0.2, 12);
    expect(result.ci[1]).toBeCloseTo(1 / 3, 12);
  });

  it("counts only samples beyond twice the observed delta", () => {
    // Worked by hand. Document 1: gold entities at tokens 0 and 2; A predicts 0 and 1, B predicts 0
    // and 2. Document 2: gold 1 and 3; A predicts 1 and 2, B predicts 1.
    // Whole set: F1(A) = 1/2 (c2 p4 g4), F1(B) = 6/7 (c3 p3 g4), delta = 5/14 ≈ 0.357.
    // Resamples: {1,1}: 1/2 vs 1, delta* = 1/2 — above delta but not above 2·delta ≈ 0.714.
    //            {2,2}: 1/2 vs 2/3, delta* = 1/6.   {1,2}: delta* = delta.
    // So p = 0 exactly: a threshold of delta would give 1/4 and a threshold of 0 would give 1.
    const gold = [[sentenceWith(4, [0, 2])], [sentenceWith(4, [1, 3])]];
    const a = [[sentenceWith(4, [0, 1])], [sentenceWith(4, [1, 2])]];
    const b = [[sentenceWith(4, [0, 2])], [sentenceWith(4, [1])]];
    const result = pairedBootstrap({ gold, a, b }, { rng: createRng(8), samples: 2000 });
    expect(result.delta).toBeCloseTo(5 / 14, 12);
    expect(result.pValue).toBe(0);
    expect(result.ci[0]).toBeCloseTo(1 / 6, 12);
    expect(result.ci[1]).toBeCloseTo(1 / 2, 12);
  });

  const simulate = (rng: Rng, documents: number, recallA: number, recallB: number): { gold: string[][][]; a: string[][][]; b: string[][][] } => {
    const gold: string[][][] = [];
    const a: string[][][] = [];
    const b: string[][][] = [];
    for (let d = 0; d < documents; d++) {
      const entities = [0, 2, 4, 6, 8];
      gold.push([sentenceWith(10, entities)]);
      a.push([sentenceWith(10, entities.filter(() => rng.next() < recallA))]);
      b.push([sentenceWith(10, entities.filter(() => rng.next() < recallB))]);
    }
    return { gold, a, b };
  };

  it("gives a small p for a clearly better tagger over many documents, and p = 1 the other way round", () => {
    const data = simulate(createRng(11), 80, 0.5, 0.8);
    const better = pairedBootstrap(data, { rng: createRng(12) });
    expect(better.delta).toBeGreaterThan(0.1);
    expect(better.pValue).toBeLessThan(0.01);
    expect(better.ci[0]).toBeGreaterThan(0);
    expect(better.ci[0]).toBeLessThan(better.delta);
    expect(better.ci[1]).toBeGreaterThan(better.delta);
    const worse = pairedBootstrap({ gold: data.gold, a: data.b, b: data.a }, { rng: createRng(12) });
    expect(worse.delta).toBeCloseTo(-better.delta, 12);
    expect(worse.pValue).toBe(1);
  });

  it("gives a large p when the taggers differ by chance only", () => {
    // Common practice for a calibration check: same-quality taggers should rarely look significant.
    // Over 40 seeds, p < 0.05 should occur about 5% of the time or less; allow up to 8 of 40.
    let significant = 0;
    for (let seed = 0; seed < 40; seed++) {
      const data = simulate(createRng(1000 + seed), 40, 0.6, 0.6);
      if (pairedBootstrap(data, { rng: createRng(seed), samples: 500 }).pValue < 0.05) significant++;
    }
    expect(significant).toBeLessThanOrEqual(8);
  });

  it("is reproducible for a seed and changes with the seed", () => {
    const data = simulate(createRng(21), 30, 0.6, 0.7);
    const first = pairedBootstrap(data, { rng: createRng(5), samples: 300, confidence: 0.9 });
    expect(pairedBootstrap(data, { rng: createRng(5), samples: 300, confidence: 0.9 })).toEqual(first);
    expect(pairedBootstrap(data, { rng: createRng(6), samples: 300, confidence: 0.9 }).ci).not.toEqual(first.ci);
    expect(first.samples).toBe(300);
  });

  it("rejects bad shapes and options, naming the document", () => {
    const gold = [[sentenceWith(3, [0])], [sentenceWith(3, [])]];
    const rng = createRng(1);
    expect(() => pairedBootstrap({ gold, a: gold, b: [gold[0], [sentenceWith(2, [])]] }, { rng })).toThrow(
      "document 1, tagger B: sentence 0: gold has 3 tags but predicted has 2",
    );
    expect(() => pairedBootstrap({ gold, a: gold.slice(1), b: gold }, { rng })).toThrow(RangeError);
    expect(() => pairedBootstrap({ gold: gold.slice(1), a: gold.slice(1), b: gold.slice(1) }, { rng })).toThrow(/at least 2 documents/);
    expect(() => pairedBootstrap({ gold, a: gold, b: gold }, { rng, samples: 0 })).toThrow(RangeError);
    expect(() => pairedBootstrap({ gold, a: gold, b: gold }, { rng, confidence: 1 })).toThrow(RangeError);
  });
});
