import { describe, expect, it } from "vitest";
import { getCount } from "./count-table";
import { buildTrigramTable } from "./estimate";
import { NO_POSITION_BUCKETS } from "./position-buckets";
import { countSupervised } from "./train";

// Deleted interpolation for trigram transitions: Brants (2000), "TnT — A Statistical
// Part-of-Speech Tagger", Proc. ANLP-2000, §2.2, Figure 1. For every state triple (t1, t2, t3) with
// f(t1,t2,t3) > 0 compare (f(t1,t2,t3)−1)/(f(t1,t2)−1), (f(t2,t3)−1)/(f(t2)−1) and (f(t3)−1)/(N−1)
// (a zero denominator counts as 0) and add f(t1,t2,t3) to λ3, λ2 or λ1, whichever ratio is largest;
// then normalise. Brants does not say how to break ties; the code gives them to the higher order.
describe("buildTrigramTable: deleted interpolation weights (Brants 2000, §2.2)", () => {
  // Two states, A = 0 and B = 1; the sentence boundary is state index 2 (written S), padded
  // S S … S as in TnT. Four sentences: "A B", "A A B", "A B", "B" (one symbol, 0, throughout).
  const K = 2;
  const sentences = [[0, 1], [0, 0, 1], [0, 1], [1]];
  const corpus = {
    symbols: Int32Array.from(sentences.flat(), () => 0),
    tags: Int32Array.from(sentences.flat()),
    sentenceStarts: Int32Array.from([0, ...sentences.map((_, s) => sentences.slice(0, s + 1).flat().length)]),
    sentenceIndex: Int32Array.from(sentences, (_, s) => s),
  };
  const stats = countSupervised(corpus, { states: K, symbols: 1, positionBuckets: NO_POSITION_BUCKETS, prevWord: false, trigrams: true, segmentStarts: null });
  const S = K;
  const key = (x: number, y: number, z: number) => (x * (K + 1) + y) * (K + 1) + z;

  it("counts the padded triples", () => {
    // By hand: S S A ×3, S A B ×2, A B S ×3, S A A ×1, A A B ×1, S S B ×1, S B S ×1 (N = 12).
    const expected: Array<[number, number, number, number]> = [
      [S, S, 0, 3], [S, 0, 1, 2], [0, 1, S, 3], [S, 0, 0, 1], [0, 0, 1, 1], [S, S, 1, 1], [S, 1, S, 1],
    ];
    for (const [x, y, z, n] of expected) expect(getCount(stats.trigrams!, key(x, y, z)), `${x} ${y} ${z}`).toBe(n);
    expect(stats.trigrams!.size).toBe(expected.length);
  });

  it("gives λ = (1/6, 1/3, 1/2) with the end state, worked by hand", () => {
    // History totals f(t1,t2): S S 4, S A 3, A B 3, A A 1, S B 1. Bigrams f(t2,t3): S A 3, A B 3,
    // B S 4, A A 1, S B 1. f(t2): S 4, A 4, B 4. f(t3): A 4, B 4, S 4. N − 1 = 11.
    //   S S A (3): 2/3, (3−1)/(4−1) = 2/3, 3/11 → tie, λ3 += 3
    //   S A B (2): 1/2, (3−1)/(4−1) = 2/3, 3/11 → λ2 += 2
    //   A B S (3): (3−1)/(3−1) = 1 → λ3 += 3
    //   S A A (1): 0/2 = 0, 0/3 = 0, 3/11 → λ1 += 1
    //   A A B (1): 0/0 → 0, 2/3, 3/11 → λ2 += 1
    //   S S B (1): 0/3 = 0, 0/3 = 0, 3/11 → λ1 += 1
    //   S B S (1): 0/0 → 0, (4−1)/(4−1) = 1 → λ2 += 1
    // λ1 = 2/12, λ2 = 4/12, λ3 = 6/12; P̂(t3) = 4/12 for A, B and the end.
    const table = buildTrigramTable(stats.trigrams!, K, true);
    table.lambdas.forEach((l, i) => expect(l, `λ${i + 1}`).toBeCloseTo([1 / 6, 1 / 3, 1 / 2][i], 12));
    [...table.unigram].forEach((p) => expect(p).toBeCloseTo(1 / 3, 12));
  });

  it("gives λ = (1/4, 3/8, 3/8) without the end state, worked by hand", () => {
    // Triples ending at S are dropped: S S A 3, S A B 2, S A A 1, A A B 1, S S B 1 (N = 8).
    // f(t1,t2): S S 4, S A 3, A A 1. f(t2,t3): S A 3, A B 3, A A 1, S B 1. f(t2): S 4, A 4.
    // f(t3): A 4, B 4. N − 1 = 7.
    //   S S A (3): 2/3, 2/3, 3/7 → tie, λ3 += 3
    //   S A B (2): 1/2, 2/3, 3/7 → λ2 += 2
    //   S A A (1): 0, 0, 3/7 → λ1 += 1
    //   A A B (1): 0/0 → 0, 2/3 → λ2 += 1
    //   S S B (1): 0, 0, 3/7 → λ1 += 1
    const table = buildTrigramTable(stats.trigrams!, K, false);
    table.lambdas.forEach((l, i) => expect(l, `λ${i + 1}`).toBeCloseTo([2 / 8, 3 / 8, 3 / 8][i], 12));
    expect([...table.unigram]).toEqual([0.5, 0.5, 0]);
  });
});
