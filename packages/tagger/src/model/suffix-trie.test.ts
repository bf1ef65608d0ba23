import { describe, expect, it } from "vitest";
import { createSyntheticDocuments } from "../kernels/synthetic";
import { createSuffixCollector, createSuffixStatistics, suffixLogRatio, type SuffixStatistics } from "../estimation/suffix-model";
import { suffixGroupOf } from "../estimation/vocabulary";
import { tinyDocuments } from "../testing/tiny-corpus";
import { addSuffixLogRatio, createSuffixTrie } from "./suffix-trie";
import { trainTagger } from "./tagger";

// The trie must give exactly suffixLogRatio's numbers (the string-keyed lookup of Brants 2000
// §2.3's successive abstraction, suffix-model.ts): bit for bit, for every word and group.
function expectSame(stats: SuffixStatistics, words: readonly string[], groups: readonly number[]): void {
  const K = stats.states;
  const trie = createSuffixTrie(stats);
  const expected = new Float64Array(K);
  const scratch = new Float64Array(2 * K);
  // Twice: the second pass reads the memoised rows.
  for (let pass = 0; pass < 2; pass++) {
    for (const word of words) {
      for (const group of groups) {
        suffixLogRatio(stats, word, group, expected, scratch);
        const got = new Float64Array(K + 2).fill(0.25);
        addSuffixLogRatio(trie, word, group, got, 1);
        expect(got[0], word).toBe(0.25);
        expect(got[K + 1], word).toBe(0.25);
        expect(Array.from(got.subarray(1, K + 1)), `${JSON.stringify(word)} group ${group} pass ${pass}`).toEqual(Array.from(expected, (x) => 0.25 + x));
      }
    }
  }
}

describe("suffix trie", () => {
  it("returns suffixLogRatio's statistics for the words of a trained model, in their own groups and others", () => {
    const docs = [...tinyDocuments, ...createSyntheticDocuments(4000, 300, 3)];
    const { model } = trainTagger(docs, { calibration: "none" });
    const stats = model.suffix!;
    expect(stats.index.size).toBeGreaterThan(50);
    const held = createSyntheticDocuments(2000, 600, 4).flatMap((d) => d.sentences.flatMap((s) => s.words));
    const words = [...new Set([...held, ...docs.flatMap((d) => d.sentences.flatMap((s) => s.words))])].slice(0, 400);
    const odd = ["", "d", "ed", "walked", "Velmoraic", "naïve", "straße", "x🙂", "🙂", "\u0001", "w1\u0001", "a".repeat(40), "W12345678"];
    const groups = [...new Set([...words, ...odd].map((w) => suffixGroupOf(model.vocabulary, w, false)))];
    expectSame(stats, [...words, ...odd], [...groups, 0, 1, 99, -1]);
  });

  it("stops where suffixLogRatio stops: unseen, empty and beyond-maximum suffixes, odd keys", () => {
    const collector = createSuffixCollector(3, 3);
    collector.add("walked", 0, 1);
    collector.add("jumped", 0, 1);
    collector.add("bed", 0, 0);
    collector.add("Table", 1, 2);
    collector.add("naïve", 0, 2);
    const base = collector.finish(0.5);
    // The same statistics through the serialized form, plus a suffix whose shorter suffix is
    // missing ("zq" without "q"), an empty node ("xd", total 0), a key longer than the maximum
    // length, and keys no group number produces ("01", "a").
    const nodes: [string, { tags: Int32Array; counts: Float64Array; total: number }][] = [];
    for (const [key, n] of base.index) {
      const from = base.offsets[n];
      const to = base.offsets[n + 1];
      nodes.push([key, { tags: base.tags.slice(from, to), counts: base.counts.slice(from, to), total: base.totals[n] }]);
    }
    const extra = (key: string, counts: number[]) => nodes.push([key, { tags: Int32Array.from(counts.map((_, k) => k)), counts: Float64Array.from(counts), total: 0 }]);
    extra("0\u0001zq", [1, 2, 3]);
    extra("0\u0001xd", [0, 0, 0]);
    extra("0\u0001ued", [3, 0, 0]);
    extra("0\u0001lked", [0, 0, 4]);
    extra("01\u0001d", [5, 0, 0]);
    extra("a\u0001d", [5, 0, 0]);
    extra("7", [5, 0, 0]);
    const stats = createSuffixStatistics(3, 3, 0.5, nodes);
    expectSame(stats, ["hopped", "walked", "talked", "glued", "zq", "q", "xd", "bxd", "ed", "", "Table", "fable", "naïve", "ve", "d"], [0, 1, 2, 7]);
  });
});
