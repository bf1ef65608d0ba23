import { describe, expect, it } from "vitest";
import { trainEmissionCorrections, trainWordTypeWeights } from "./perceptron";
import { addFeatureWeights } from "./word-type-features";
import { sentenceLogLikelihood } from "../model/decode";
import { buildFirstOrderProblem } from "../model/decode-input";
import { decodeSentence } from "../model/decode";
import { tagSentence, trainTagger } from "../model/tagger";
import { decodeViterbi } from "../kernels/viterbi";
import { tinyDocuments } from "../testing/tiny-corpus";
import type { ColumnDocument } from "../text/conll";

// Ten sentences in three documents: the jackknife cuts five blocks of two sentences, and each
// block's names are mostly unseen by the other four, so the jackknifed models make mistakes.
const documents = tinyDocuments;
const counts = (docs: readonly ColumnDocument[]) => trainTagger(docs, { calibration: "none" }).model;

describe("averaged perceptron corrections of the emission scores (Collins 2002 §2)", () => {
  it("returns the mean of the weights before the first and after every sentence visit", () => {
    const model = counts(documents);
    const K = model.tags.length;
    const sum = new Float64Array(model.statistics.symbols * K);
    let visits = 0;
    let changed = 0;
    let previous = new Float64Array(sum.length);
    const averaged = trainEmissionCorrections(model, documents, 3, counts, 0.5, (w) => {
      visits++;
      for (let x = 0; x < w.length; x++) sum[x] += w[x];
      if (w.some((v, x) => v !== previous[x])) changed++;
      previous = w.slice();
    });
    const sentences = documents.reduce((n, d) => n + d.sentences.length, 0);
    expect(visits).toBe(3 * sentences);
    // The jackknifed count models make mistakes on this corpus, so some visits update the weights.
    expect(changed).toBeGreaterThan(0);
    for (let x = 0; x < sum.length; x++) expect(averaged[x]).toBeCloseTo(sum[x] / (visits + 1), 12);
    // Each update adds +rate at one cell and −rate at another, so all the weights sum to 0.
    expect(previous.reduce((a, b) => a + b, 0)).toBeCloseTo(0, 12);
  });

  it("a model with corrections decodes as Viterbi over the count model's scores plus its symbols' weights, on both tagging paths", () => {
    const { model } = trainTagger(documents, { perceptron: 2, calibration: "none" });
    const plain = counts(documents);
    expect(model.corrections).not.toBeNull();
    expect(model.corrections!.some((v) => v !== 0)).toBe(true);
    const K = model.tags.length;
    const probes = [...documents.flatMap((d) => d.sentences.map((s) => s.words)), ["Nessa", "visited", "Zerith", "in", "1991", "."]];
    for (const words of probes) {
      const { params, input, symbols } = buildFirstOrderProblem(plain, words);
      for (let t = 0; t < words.length; t++) for (let k = 0; k < K; k++) input.scores[t * K + k] += model.corrections![symbols[t] * K + k];
      const expected = Array.from(decodeViterbi(params, input).path, (k) => model.tags[k]);
      expect(Array.from(decodeSentence(model, words).path, (k) => model.tags[k])).toEqual(expected);
      expect(tagSentence(model, words).tags).toEqual(expected);
    }
  });

  it("is refused for second-order models", () => {
    expect(() => trainTagger(documents, { perceptron: 1, order: 2 })).toThrow(/perceptron needs order 1/);
  });
});

describe("averaged perceptron over word-type features (Collins 2002 §2–3, Ratnaparkhi 1996 templates)", () => {
  it("returns the mean of the weights before the first and after every sentence visit, for the features it keeps", () => {
    const model = counts(documents);
    const K = model.tags.length;
    let sum = new Float64Array(0);
    let visits = 0;
    let last = new Float64Array(0);
    let names: readonly string[] = [];
    const table = trainWordTypeWeights(model, documents, 3, counts, 0.5, (w, n) => {
      if (sum.length === 0) sum = new Float64Array(w.length);
      visits++;
      for (let x = 0; x < w.length; x++) sum[x] += w[x];
      last = w.slice();
      names = n;
    });
    const sentences = documents.reduce((n, d) => n + d.sentences.length, 0);
    expect(visits).toBe(3 * sentences);
    expect(last.some((v) => v !== 0)).toBe(true);
    expect(table.names.length).toBeGreaterThan(0);
    names.forEach((name, f) => {
      const g = table.index.get(name);
      for (let k = 0; k < K; k++) {
        const mean = sum[f * K + k] / (visits + 1);
        if (g === undefined) expect(mean).toBeCloseTo(0, 12);
        else expect(table.weights[g * K + k]).toBeCloseTo(mean, 12);
      }
    });
    // Every feature kept has a non-zero weight for some tag; every update adds and takes the same.
    for (let g = 0; g < table.names.length; g++) expect(Array.from(table.weights.subarray(g * K, g * K + K)).some((v) => v !== 0)).toBe(true);
    expect(last.reduce((a, b) => a + b, 0)).toBeCloseTo(0, 10);
  });

  it("with 0 passes leaves the count model's scores bit-identical", () => {
    const { model } = trainTagger(documents, { perceptron: 0, perceptronFeatures: "word-type", calibration: "none" });
    const plain = counts(documents);
    expect(model.features).toBeNull();
    const model0 = { ...plain, features: trainWordTypeWeights(plain, documents, 0, counts) };
    expect(model0.features.names).toHaveLength(0);
    const probes = [...documents.flatMap((d) => d.sentences.map((s) => s.words)), ["Nessa", "visited", "Zerith", "in", "1991", "."]];
    for (const words of probes) {
      expect(buildFirstOrderProblem(model0, words).input.scores).toEqual(buildFirstOrderProblem(plain, words).input.scores);
      expect(sentenceLogLikelihood(model0, words)).toBe(sentenceLogLikelihood(plain, words));
      expect(tagSentence(model0, words)).toEqual(tagSentence(plain, words));
      expect(tagSentence(model, words)).toEqual(tagSentence(plain, words));
    }
  });

  it("a model with feature weights decodes as Viterbi over the count scores plus each word's summed weights, on both tagging paths", () => {
    const { model } = trainTagger(documents, { perceptron: 2, perceptronFeatures: "word-type", calibration: "none" });
    const plain = counts(documents);
    expect(model.features).not.toBeNull();
    const K = model.tags.length;
    const probes = [...documents.flatMap((d) => d.sentences.map((s) => s.words)), ["Nessa", "visited", "Zerith", "in", "1991", "."]];
    let changed = 0;
    for (const words of probes) {
      const { params, input, symbols } = buildFirstOrderProblem(plain, words);
      const before = input.scores.slice();
      words.forEach((w, t) => addFeatureWeights(model.features!, null, w, t === 0, symbols[t] < model.vocabulary.words.length, input.scores, t * K));
      if (input.scores.some((v, x) => v !== before[x])) changed++;
      const expected = Array.from(decodeViterbi(params, input).path, (k) => model.tags[k]);
      expect(Array.from(decodeSentence(model, words).path, (k) => model.tags[k])).toEqual(expected);
      expect(tagSentence(model, words).tags).toEqual(expected);
    }
    expect(changed).toBeGreaterThan(0);
  });

  it("trains and tags a second-order (trigram) model too", () => {
    const { model } = trainTagger(documents, { perceptron: 2, perceptronFeatures: "word-type", order: 2, prevWord: false, contextEmissions: false, calibration: "none" });
    expect(model.features).not.toBeNull();
    expect(tagSentence(model, ["Nessa", "visited", "Zerith", "."]).tags).toHaveLength(4);
  });
});
