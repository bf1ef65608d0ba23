import { describe, expect, it } from "vitest";
import { addNeighbourWeights, neighbourFeatures } from "./neighbour-features";
import { createFeatureWeights, type FeatureWeights } from "./word-type-features";
import { trainNeighbourWeights } from "./perceptron";
import { buildFirstOrderProblem } from "../model/decode-input";
import { decodeSentence, sentenceLogLikelihood } from "../model/decode";
import { tagSentence, trainTagger } from "../model/tagger";
import type { TaggerModel } from "../model/tagger-model";
import { decodeViterbi } from "../kernels/viterbi";
import { tinyDocuments } from "../testing/tiny-corpus";
import type { ColumnDocument } from "../text/conll";

const counts = (docs: readonly ColumnDocument[]) => trainTagger(docs, { calibration: "none" }).model;
const probes = [...tinyDocuments.flatMap((d) => d.sentences.map((s) => s.words)), ["Nessa", "visited", "Zerith", "in", "1991", "."], ["met", "zorvik", "in", "tirranel"]];

/** Log score of one tag path under a first-order problem (start, steps, emissions, end), summed by hand. */
function pathScore(problem: ReturnType<typeof buildFirstOrderProblem>, path: readonly number[]): number {
  const { params, input } = problem;
  const K = params.states;
  let score = params.start[path[0]] + input.scores[path[0]];
  for (let t = 1; t < path.length; t++) {
    const m = input.transitionIndex === null ? 0 : input.transitionIndex[t];
    score += params.transitions[m * K * K + path[t - 1] * K + path[t]] + input.scores[t * K + path[t]];
  }
  return params.end === null ? score : score + params.end[path[path.length - 1]];
}

/** Best score over all K^T paths whose token t has tag k (brute force). */
function bestWith(problem: ReturnType<typeof buildFirstOrderProblem>, T: number, t: number, k: number): number {
  const K = problem.params.states;
  let best = -Infinity;
  const path = new Array<number>(T).fill(0);
  for (let code = 0; code < K ** T; code++) {
    for (let i = 0, c = code; i < T; i++, c = Math.floor(c / K)) path[i] = c % K;
    if (path[t] === k) best = Math.max(best, pathScore(problem, path));
  }
  return best;
}

describe("neighbour features (Ratnaparkhi 1996 Table 1: w-2, w-1, w+1, w+2 with t_i, as Collins 2002 §3 uses them)", () => {
  it("lists a known sentence's features token by token, written out by hand", () => {
    const words = ["met", "@Zorvik", "in", "Velmora"];
    expect(neighbourFeatures(words, 0)).toEqual(["w-2=<s>", "w-1=<s>", "w+1=@zorvik", "class+1=handle", "shape+1=@Xxxxx", "w+2=in"]);
    // Token 1's left neighbour is token 0, whose class carries the first-word position.
    expect(neighbourFeatures(words, 1)).toEqual(["w-2=<s>", "w-1=met", "class-1=firstWord+lowerCase", "shape-1=xxx", "w+1=in", "class+1=lowerCase", "shape+1=xx", "w+2=velmora"]);
    expect(neighbourFeatures(words, 3)).toEqual(["w-2=@zorvik", "w-1=in", "class-1=lowerCase", "shape-1=xx", "w+1=</s>", "w+2=</s>"]);
    expect(neighbourFeatures(["ok"], 0)).toEqual(["w-2=<s>", "w-1=<s>", "w+1=</s>", "w+2=</s>"]);
  });

  it("adds each token's neighbours' summed weights, computed by hand, and keeps the exp rows in step", () => {
    const K = 2;
    const table = createFeatureWeights(["w-1=met", "class+1=lowerCase", "w-1=<s>", "w+2=</s>", "w-2=met"], Float64Array.from([1, 2, 0.5, -1, 0.25, 0, 0, 4, 8, 16]), K);
    const words = ["met", "zorvik", "in"];
    const log = Float64Array.from([0, 0, 10, 20, 0, -1]);
    const exp = new Float64Array(6);
    addNeighbourWeights(table, words, log, exp);
    // Token 0: w-2=<s> (absent), w-1=<s> (0.25, 0), w+1=zorvik, class+1=lowerCase (0.5, −1), shape+1=xxxxx, w+2=in → (0.75, −1).
    // Token 1: w-2=<s>, w-1=met (1, 2), class-1=firstWord+lowerCase, shape-1, w+1=in, class+1=lowerCase (0.5, −1), shape+1, w+2=</s> (0, 4) → (1.5, 5).
    // Token 2: w-2=met (8, 16), w-1=zorvik, class-1=lowerCase (absent: only class+1 has a weight), shape-1, w+1=</s>, w+2=</s> (0, 4) → (8, 20).
    expect(Array.from(log)).toEqual([0.75, -1, 11.5, 25, 8, 19]);
    expect(Array.from(exp)).toEqual(Array.from(log, Math.exp));
    // The cached rows give the same sums the second time.
    const again = new Float64Array(6);
    addNeighbourWeights(table, words, again, null);
    expect(Array.from(again)).toEqual([0.75, -1, 1.5, 5, 8, 20]);
  });

  it("a neighbour weight flips a token's tag exactly when it exceeds the best paths' margin (brute force over all paths)", () => {
    // Two plain tags: N for name tokens, O otherwise.
    const docs: ColumnDocument[] = tinyDocuments.map((d) => ({ sentences: d.sentences.map((s) => ({ words: s.words, tags: s.tags.map((tag) => (tag === "O" ? "O" : "N")) })) }));
    const plain = counts(docs);
    expect(plain.tags).toHaveLength(2);
    const words = ["they", "met", "quillory", "in", "town"];
    const T = words.length;
    const problem = buildFirstOrderProblem(plain, words);
    const before = decodeViterbi(problem.params, problem.input).path;
    // Token 2 follows "met": the feature w-1=met adds its weight to token 2 only.
    const chosen = before[2];
    const other = 1 - chosen;
    const margin = bestWith(problem, T, 2, chosen) - bestWith(problem, T, 2, other);
    expect(margin).toBeGreaterThan(0);
    const withWeight = (delta: number): TaggerModel => {
      const weights = new Float64Array(2);
      weights[other] = delta;
      return { ...plain, neighbourFeatures: createFeatureWeights(["w-1=met"], weights, 2) };
    };
    for (const [delta, flips] of [
      [margin + 0.25, true],
      [margin - 0.25, false],
    ] as const) {
      const model = withWeight(delta);
      const path = decodeSentence(model, words).path;
      expect(path[2]).toBe(flips ? other : chosen);
      // Both tagging paths agree, and the other tokens' scores are untouched.
      expect(tagSentence(model, words).tags).toEqual(Array.from(path, (k) => model.tags[k]));
      const scores = buildFirstOrderProblem(model, words).input.scores;
      for (let x = 0; x < T * 2; x++) expect(scores[x]).toBe(problem.input.scores[x] + (x === 2 * 2 + other ? delta : 0));
      const best = decodeSentence(model, words).logProbability;
      expect(best).toBeCloseTo(flips ? bestWith(problem, T, 2, other) + delta : bestWith(problem, T, 2, chosen), 10);
    }
  });

  it("with zero weights tags exactly as the count model, on both tagging paths", () => {
    const plain = counts(tinyDocuments);
    const K = plain.tags.length;
    const names = ["w-1=in", "w+1=.", "class-1=lowerCase", "w-1=<s>", "w+1=</s>"];
    const zero: TaggerModel = { ...plain, neighbourFeatures: createFeatureWeights(names, new Float64Array(names.length * K), K) };
    for (const words of probes) {
      expect(buildFirstOrderProblem(zero, words).input.scores).toEqual(buildFirstOrderProblem(plain, words).input.scores);
      expect(sentenceLogLikelihood(zero, words)).toBe(sentenceLogLikelihood(plain, words));
      expect(tagSentence(zero, words)).toEqual(tagSentence(plain, words));
    }
  });

  it("a trained model decodes as Viterbi over the count scores plus the word-type rows plus the neighbour sums, on both tagging paths", () => {
    const { model } = trainTagger(tinyDocuments, { perceptron: 2, perceptronFeatures: "neighbours", calibration: "none" });
    expect(model.features).not.toBeNull();
    expect(model.neighbourFeatures).not.toBeNull();
    expect(model.neighbourFeatures!.names.length).toBeGreaterThan(0);
    const wordTypeOnly: TaggerModel = { ...model, neighbourFeatures: null };
    const K = model.tags.length;
    let changed = 0;
    for (const words of probes) {
      const { params, input } = buildFirstOrderProblem(wordTypeOnly, words);
      const before = input.scores.slice();
      addNeighbourWeights(model.neighbourFeatures!, words, input.scores, null);
      if (input.scores.some((v, x) => v !== before[x])) changed++;
      const expected = Array.from(decodeViterbi(params, input).path, (k) => model.tags[k]);
      expect(Array.from(decodeSentence(model, words).path, (k) => model.tags[k])).toEqual(expected);
      expect(tagSentence(model, words).tags).toEqual(expected);
      expect(input.scores.length).toBe(words.length * K);
    }
    expect(changed).toBeGreaterThan(0);
  });

  it("keeps the averaged weights of the features it returns, split into word-type and neighbour tables", () => {
    const model = counts(tinyDocuments);
    const K = model.tags.length;
    let sum = new Float64Array(0);
    let visits = 0;
    let names: readonly string[] = [];
    const onStep = (w: Float64Array, n: readonly string[]) => {
      if (sum.length < w.length) {
        const next = new Float64Array(w.length);
        next.set(sum);
        sum = next;
      }
      visits++;
      for (let x = 0; x < w.length; x++) sum[x] += w[x];
      names = n;
    };
    let afterOne: { wordType: FeatureWeights; neighbours: FeatureWeights } | null = null;
    const { wordType, neighbours } = trainNeighbourWeights(model, tinyDocuments, 2, counts, { rate: 0.5, onStep, onPass: (tables, passes) => ((afterOne = tables), expect(passes).toBe(1)) });
    // The tables after pass 1 of a 2-pass run are those of a 1-pass run.
    const one = trainNeighbourWeights(model, tinyDocuments, 1, counts, { rate: 0.5 });
    expect(afterOne).toEqual(one);
    expect(neighbours.names.every((n) => !n.startsWith("known:") && !n.startsWith("class:"))).toBe(true);
    expect(wordType.names.every((n) => n.startsWith("known:") || n.startsWith("class:"))).toBe(true);
    names.forEach((name, f) => {
      const table = wordType.index.has(name) ? wordType : neighbours;
      const g = table.index.get(name);
      for (let k = 0; k < K; k++) {
        const mean = sum[f * K + k] / (visits + 1);
        if (g === undefined) expect(mean).toBeCloseTo(0, 12);
        else expect(table.weights[g * K + k]).toBeCloseTo(mean, 12);
      }
    });
  });

  it("trains and tags a second-order (trigram) model too", () => {
    const { model } = trainTagger(tinyDocuments, { perceptron: 2, perceptronFeatures: "neighbours", order: 2, prevWord: false, contextEmissions: false, calibration: "none" });
    expect(model.neighbourFeatures).not.toBeNull();
    expect(tagSentence(model, ["Nessa", "visited", "Zerith", "."]).tags).toHaveLength(4);
  });
});
