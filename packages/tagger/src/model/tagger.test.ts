import { describe, expect, it } from "vitest";
import { tagsToChunks } from "../text/bio";
import { buildFirstOrderProblem } from "./decode-input";
import { sentencePosteriors } from "./decode";
import { tagDocument, tagSentence, trainTagger } from "./tagger";
import { enumeratePaths, pathLogProbability } from "../testing/hmm-fixtures";
import { tinyDocuments } from "../testing/tiny-corpus";
import { transitionMatrixCount } from "../kernels/hmm-params";

describe("trainTagger / tagSentence", () => {
  it("learns IOB2 tags in order of first appearance and tags training sentences back", () => {
    const { model } = trainTagger(tinyDocuments);
    expect(model.scheme).toBe("iob");
    expect(model.tags.slice(0, 4)).toEqual(["B-PER", "I-PER", "O", "B-LOC"]);
    const result = tagSentence(model, ["Taven", "Orrick", "lives", "in", "Velmora", "."]);
    expect(result.tags).toEqual(["B-PER", "I-PER", "O", "O", "B-LOC", "O"]);
    expect(result.chunks.map((c) => [c.type, c.start, c.end])).toEqual([
      ["PER", 0, 2],
      ["LOC", 4, 5],
    ]);
    for (const c of result.chunks) expect(c.confidence).toBeGreaterThan(0.5);
    expect(result.logLikelihood).toBeLessThan(0);
  });

  it("never outputs invalid IOB2 with the default constraints, even for unseen words", () => {
    const { model } = trainTagger(tinyDocuments);
    for (const words of [["Zorvik", "Quux", "visited", "Blorp", "City"], ["in", "Xyzzy", "Corp"], ["Foo"]]) {
      const { tags } = tagSentence(model, words);
      tags.forEach((tag, t) => {
        if (!tag.startsWith("I-")) return;
        expect(t, `${words.join(" ")} → ${tags.join(" ")}`).toBeGreaterThan(0);
        expect(tags[t - 1].slice(2), `${words.join(" ")} → ${tags.join(" ")}`).toBe(tag.slice(2));
      });
    }
  });

  it.each([
    ["position-free", { prevWord: false, contextEmissions: false, calibration: "none" as const }, 1],
    ["per-step (previous word, context emissions)", { prevWord: true, contextEmissions: true, calibration: "none" as const }, 4],
  ])("chunk confidence equals the brute-force probability that exactly that chunk is present (%s)", (_name, config, matrices) => {
    const { model } = trainTagger(tinyDocuments, config);
    const words = ["Ilsa", "lives", "in", "Zerith"];
    const result = tagSentence(model, words);
    const { params, input } = buildFirstOrderProblem(model, words, 0);
    expect(transitionMatrixCount(params)).toBe(matrices);
    const brute = enumeratePaths(params, input);
    const K = model.tags.length;
    for (const chunk of result.chunks) {
      let mass = 0;
      const total = K ** words.length;
      const path = new Int32Array(words.length);
      for (let n = 0; n < total; n++) {
        let rest = n;
        for (let t = words.length - 1; t >= 0; t--) {
          path[t] = rest % K;
          rest = Math.floor(rest / K);
        }
        const tags = Array.from(path, (k) => model.tags[k]);
        if (tagsToChunks(tags).some((c) => c.start === chunk.start && c.end === chunk.end && c.type === chunk.type)) {
          mass += Math.exp(pathLogProbability(params, input, path) - brute.logLikelihood);
        }
      }
      expect(chunk.confidence).toBeCloseTo(mass, 10);
    }
    expect(result.chunks.length).toBeGreaterThan(0);
  });

  it("treats non-IOB tags as plain states with no chunks, and IOB1 input as IOB2", () => {
    const pos = [{ sentences: [{ words: ["the", "dog", "runs"], tags: ["DT", "NN", "VBZ"] }, { words: ["a", "cat", "sleeps"], tags: ["DT", "NN", "VBZ"] }] }];
    const { model } = trainTagger(pos);
    expect(model.scheme).toBe("plain");
    const tagged = tagSentence(model, ["the", "cat", "runs"]);
    expect(tagged.tags).toEqual(["DT", "NN", "VBZ"]);
    expect(tagged.chunks).toEqual([]);
    const iob1 = [{ sentences: [{ words: ["Taven", "Orrick", "ran"], tags: ["I-PER", "I-PER", "O"] }] }];
    expect(trainTagger(iob1).model.tags).toEqual(["B-PER", "I-PER", "O"]);
  });

  it("posteriors sum to 1 per token for every model variant", () => {
    const variants = [{}, { order: 2 as const }, { positionBuckets: { token: [1, 3], sentence: [1] } }, { contextEmissions: false, prevWord: false }, { wordClasses: "bikel" as const }];
    for (const config of variants) {
      const { model } = trainTagger(tinyDocuments, config);
      const words = ["Nessa", "works", "for", "Quorvel", "Corp", "in", "Zerith", "."];
      const { posteriors } = sentencePosteriors(model, words, 1);
      const K = model.tags.length;
      for (let t = 0; t < words.length; t++) {
        let sum = 0;
        for (let k = 0; k < K; k++) sum += posteriors[t * K + k];
        expect(sum, `${JSON.stringify(config)} token ${t}`).toBeCloseTo(1, 10);
      }
    }
  });

  it("does not modify its input documents", () => {
    const copy = JSON.parse(JSON.stringify(tinyDocuments));
    trainTagger(tinyDocuments, { order: 2 });
    expect(tinyDocuments).toEqual(copy);
  });

  it("tags whole documents with sentence indices and handles empty sentences", () => {
    const { model } = trainTagger(tinyDocuments, { positionBuckets: { token: [], sentence: [1] } });
    const tags = tagDocument(model, [["Velmora", "."], [], ["Taven", "moved", "."]]);
    expect(tags.map((s) => s.length)).toEqual([2, 0, 3]);
    expect(tagSentence(model, [])).toEqual({ tags: [], chunks: [], logLikelihood: 0 });
  });

  it("refuses an invalid configuration with a RangeError naming the option", () => {
    expect(() => trainTagger(tinyDocuments, { rare: -1 })).toThrow(/rare/);
    expect(() => trainTagger(tinyDocuments, { order: 3 as 1 })).toThrow(/order/);
    expect(() => trainTagger([])).toThrow(/no labelled tokens/);
  });
});
