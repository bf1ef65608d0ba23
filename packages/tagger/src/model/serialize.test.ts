import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { sentenceLogLikelihood } from "./decode";
import { loadModel, MODEL_SCHEMA_VERSION, serializeModel } from "./serialize";
import { tagDocument, tagSentence, trainTagger } from "./tagger";
import { tinyDocuments, tinyUnlabelled } from "../testing/tiny-corpus";

const probe = [
  ["Nessa", "Arvell", "works", "for", "Quorvel", "Corp", "in", "Zerith", "."],
  ["Zorvik", "visited", "Velmora", "in", "1990", "."],
];

describe("serializeModel / loadModel", () => {
  it.each([
    ["default", {}],
    ["second order", { order: 2 as const }],
    ["position buckets", { positionBuckets: { token: [1, 2], sentence: [1] } }],
    ["bikel classes, no suffixes", { wordClasses: "bikel" as const, suffixLength: 0 }],
    ["extended classes", { wordClasses: "extended" as const }],
    ["informal classes", { wordClasses: "informal" as const }],
    ["word clusters", { clusters: 4 }],
    ["perceptron", { perceptron: 2 }],
    ["perceptron over word-type features", { perceptron: 2, perceptronFeatures: "word-type" as const }],
    ["perceptron over word-type and neighbour features", { perceptron: 2, perceptronFeatures: "neighbours" as const }],
    ["NLTK-compatible", { nltkCompatible: true }],
  ])("round-trips through JSON text with identical predictions and likelihoods (%s)", (_name, config) => {
    const { model } = trainTagger(tinyDocuments, config);
    const text = JSON.stringify(serializeModel(model));
    const loaded = loadModel(JSON.parse(text));
    expect(tagDocument(loaded, probe)).toEqual(tagDocument(model, probe));
    for (const words of probe) {
      expect(sentenceLogLikelihood(loaded, words)).toBe(sentenceLogLikelihood(model, words));
      expect(tagSentence(loaded, words)).toEqual(tagSentence(model, words));
    }
    expect(loaded.parameters.emissions).toEqual(model.parameters.emissions);
    expect(loaded.parameters.transitions).toEqual(model.parameters.transitions);
    expect(JSON.stringify(serializeModel(loaded))).toBe(text);
  });

  it("round-trips a model refined by EM (fractional counts)", () => {
    const { model } = trainTagger(tinyDocuments, { semi: "em", iterations: 2 }, { unlabelled: tinyUnlabelled });
    const loaded = loadModel(JSON.parse(JSON.stringify(serializeModel(model))));
    expect(loaded.parameters.emissions).toEqual(model.parameters.emissions);
    expect(tagDocument(loaded, probe)).toEqual(tagDocument(model, probe));
  });

  it("stores schema version, tag set, vocabulary, parameters, config and data summary", () => {
    const json = serializeModel(trainTagger(tinyDocuments, { rare: 0 }).model);
    expect(json.format).toBe("tagloom-hmm");
    expect(json.schemaVersion).toBe(MODEL_SCHEMA_VERSION);
    expect(json.tags).toContain("B-PER");
    expect(json.vocabulary.words).toContain("Velmora");
    expect(json.parameters.kind).toBe("sufficient-statistics");
    expect(json.config.order).toBe(1);
    expect(json.config.rare).toBe(0);
    expect(json.summary.tokens).toBe(tinyDocuments.flatMap((d) => d.sentences).reduce((n, s) => n + s.words.length, 0));
  });

  it("refuses unknown versions, other formats and damaged files with clear errors", () => {
    const json = serializeModel(trainTagger(tinyDocuments).model);
    expect(() => loadModel({ ...json, schemaVersion: 99 })).toThrow(/unsupported schema version 99; this version of @tagloom\/tagger reads versions 1, 2, 3, 4, 5, 6 and 7/);
    expect(() => loadModel({ ...json, format: "other" })).toThrow(/not a Tagloom tagger model/);
    expect(() => loadModel(null)).toThrow(/expected an object/);
    expect(() => loadModel({ ...json, tags: json.tags.slice(1) })).toThrow(/parameters.states/);
    const broken = JSON.parse(JSON.stringify(json));
    broken.parameters.emissions.indices[0] = 1e9;
    expect(() => loadModel(broken)).toThrow(/parameters.emissions.indices\[0\]: 1000000000 outside/);
    const badConfig = JSON.parse(JSON.stringify(json));
    badConfig.config.rare = -3;
    expect(() => loadModel(badConfig)).toThrow(/config: rare must be/);
  });
});

describe("schema version 1", () => {
  it("a version-1 file written before calibration existed still loads and tags identically", () => {
    // model-v1.json: a model serialized by the schema-1 writer with the tags and chunk
    // confidences it gave then (synthetic words, no real names).
    const fixture = JSON.parse(readFileSync(fileURLToPath(new URL("../testing/model-v1.json", import.meta.url)), "utf8")) as {
      model: { schemaVersion: number };
      sentences: string[][];
      expected: { tags: string[]; chunks: { type: string; start: number; end: number; confidence: number }[]; logLikelihood: number }[];
    };
    expect(fixture.model.schemaVersion).toBe(1);
    const model = loadModel(fixture.model);
    expect(model.calibration).toBeNull();
    expect(model.config.calibration).toBe("none");
    fixture.sentences.forEach((words, i) => {
      const result = tagSentence(model, words);
      const expected = fixture.expected[i];
      expect(result.tags).toEqual(expected.tags);
      expect(result.logLikelihood).toBeCloseTo(expected.logLikelihood, 9);
      expect(result.chunks.map((c) => [c.type, c.start, c.end])).toEqual(expected.chunks.map((c) => [c.type, c.start, c.end]));
      result.chunks.forEach((c, k) => expect(c.confidence).toBeCloseTo(expected.chunks[k].confidence, 12));
    });
    // Written again, it is a current-version file with no calibration that loads to the same tags.
    const again = loadModel(JSON.parse(JSON.stringify(serializeModel(model))));
    expect(serializeModel(again).schemaVersion).toBe(MODEL_SCHEMA_VERSION);
    expect(tagSentence(again, fixture.sentences[0]).tags).toEqual(fixture.expected[0].tags);
  });
});

describe("schema version 3", () => {
  it("names the informal word classes, which a version-2 file cannot", () => {
    const json = serializeModel(trainTagger(tinyDocuments, { wordClasses: "informal" }).model);
    expect(json.schemaVersion).toBe(MODEL_SCHEMA_VERSION);
    expect(json.vocabulary.wordClasses).toBe("informal");
    expect(() => loadModel({ ...json, schemaVersion: 2 })).toThrow(/vocabulary.wordClasses/);
  });

  it("a version-2 file with extended classes loads and tags as a freshly trained extended model", () => {
    // Plain Platt calibration: a version-2 writer could not store the span-length coefficient.
    const { model } = trainTagger(tinyDocuments, { wordClasses: "extended", calibration: "platt" });
    const v2 = { ...serializeModel(model), schemaVersion: 2 };
    const loaded = loadModel(JSON.parse(JSON.stringify(v2)));
    expect(loaded.vocabulary.scheme).toBe("extended");
    for (const words of probe) expect(tagSentence(loaded, words)).toEqual(tagSentence(model, words));
  });
});

describe("schema version 4", () => {
  const documents = [...tinyDocuments, ...tinyDocuments, ...tinyDocuments];
  const probe = documents.flatMap((d) => d.sentences.map((s) => s.words));

  it("stores the span-length coefficient of the calibration and reads it back to the same confidences", () => {
    const { model } = trainTagger(documents, { calibration: "platt-length" });
    expect(model.calibration).not.toBeNull();
    const json = serializeModel(model);
    expect(json.schemaVersion).toBe(MODEL_SCHEMA_VERSION);
    expect(json.calibration?.c).toBe(model.calibration!.c);
    const loaded = loadModel(JSON.parse(JSON.stringify(json)));
    for (const words of probe) expect(tagSentence(loaded, words)).toEqual(tagSentence(model, words));
    const missing = JSON.parse(JSON.stringify(json));
    delete missing.calibration.c;
    expect(() => loadModel(missing)).toThrow(/calibration.c/);
  });

  it("a version-3 file (Platt calibration without c) loads with c = 0 and tags identically", () => {
    // The version-3 writer stored { method, a, b }; a plain-Platt model is exactly what it wrote.
    const { model } = trainTagger(documents, { calibration: "platt" });
    const v3 = JSON.parse(JSON.stringify({ ...serializeModel(model), schemaVersion: 3 }));
    delete v3.calibration.c;
    const loaded = loadModel(v3);
    expect(loaded.calibration).toEqual({ method: "platt", a: model.calibration!.a, b: model.calibration!.b, c: 0 });
    for (const words of probe) expect(tagSentence(loaded, words)).toEqual(tagSentence(model, words));
  });
});

describe("schema version 5", () => {
  const documents = [...tinyDocuments, ...tinyDocuments, ...tinyDocuments];
  const probe = [...documents.flatMap((d) => d.sentences.map((s) => s.words)), ...tinyUnlabelled.flat()];

  it("stores the word clusters and their prefix statistics and reads them back to the same tags and scores", () => {
    const { model } = trainTagger(documents, { clusters: 5 }, { unlabelled: tinyUnlabelled });
    const json = serializeModel(model);
    expect(json.schemaVersion).toBe(MODEL_SCHEMA_VERSION);
    const stored = json.parameters.clusters!;
    // Unlabelled words are clustered too, each into one of the 5 clusters.
    expect(stored.words).toContain("Tirranel");
    expect(new Set(stored.cluster).size).toBe(5);
    expect(stored.paths).toHaveLength(5);
    const loaded = loadModel(JSON.parse(JSON.stringify(json)));
    for (const words of probe) {
      expect(tagSentence(loaded, words)).toEqual(tagSentence(model, words));
      expect(sentenceLogLikelihood(loaded, words)).toBe(sentenceLogLikelihood(model, words));
    }
    // The clusters change the scores of unknown words that the clustering saw.
    const { model: plain } = trainTagger(documents, {});
    expect(sentenceLogLikelihood(model, tinyUnlabelled[0][0])).not.toBe(sentenceLogLikelihood(plain, tinyUnlabelled[0][0]));
  });

  it("a version-4 file (no clusters field, no clusters option) loads with clusters off and tags identically", () => {
    const { model } = trainTagger(documents, {});
    const v4 = JSON.parse(JSON.stringify({ ...serializeModel(model), schemaVersion: 4 }));
    delete v4.parameters.clusters;
    delete v4.config.clusters;
    const loaded = loadModel(v4);
    expect(loaded.clusters).toBeNull();
    expect(loaded.config.clusters).toBe(0);
    for (const words of probe) {
      expect(tagSentence(loaded, words)).toEqual(tagSentence(model, words));
      expect(sentenceLogLikelihood(loaded, words)).toBe(sentenceLogLikelihood(model, words));
    }
  });

  it("refuses clusters that disagree with the config or are damaged", () => {
    const json = serializeModel(trainTagger(documents, { clusters: 3 }).model);
    expect(() => loadModel({ ...json, config: { ...json.config, clusters: 0 } })).toThrow(/parameters.clusters: present exactly when config.clusters is above 0/);
    const damaged = JSON.parse(JSON.stringify(json));
    damaged.parameters.clusters.cluster[0] = 7;
    expect(() => loadModel(damaged)).toThrow(/parameters.clusters: word clusters: cluster 7 of word 0 outside 3 clusters/);
    const missing = JSON.parse(JSON.stringify(json));
    delete missing.parameters.clusters;
    expect(() => loadModel(missing)).toThrow(/parameters.clusters: expected an object/);
  });
});

describe("schema version 6", () => {
  it("a version-5 file (word clusters and symbol perceptron weights, written by the version-5 writer) loads and tags identically", () => {
    // model-v5.json: trained on the tiny corpus three times over with --clusters 4 --perceptron 2
    // (and the tiny unlabelled text) by the version-5 code, with the tags, chunk confidences and
    // log-likelihoods it gave then (invented words only).
    const fixture = JSON.parse(readFileSync(fileURLToPath(new URL("../testing/model-v5.json", import.meta.url)), "utf8")) as {
      model: { schemaVersion: number; config: Record<string, unknown> };
      sentences: string[][];
      expected: { tags: string[]; chunks: { type: string; start: number; end: number; confidence: number }[]; logLikelihood: number }[];
    };
    expect(fixture.model.schemaVersion).toBe(5);
    expect(fixture.model.config.perceptronFeatures).toBeUndefined();
    const model = loadModel(fixture.model);
    expect(model.config.perceptronFeatures).toBe("symbol");
    expect(model.corrections).not.toBeNull();
    expect(model.features).toBeNull();
    fixture.sentences.forEach((words, i) => expect(tagSentence(model, words)).toEqual(fixture.expected[i]));
    const again = loadModel(JSON.parse(JSON.stringify(serializeModel(model))));
    fixture.sentences.forEach((words, i) => expect(tagSentence(again, words)).toEqual(fixture.expected[i]));
  });

  it("stores the word-type feature weights and refuses them when they disagree with the config or are damaged", () => {
    const json = serializeModel(trainTagger(tinyDocuments, { perceptron: 2, perceptronFeatures: "word-type" }).model);
    expect(json.parameters.features!.names.length).toBeGreaterThan(0);
    expect(json.parameters.corrections).toBeNull();
    expect(() => loadModel({ ...json, config: { ...json.config, perceptronFeatures: "symbol" } })).toThrow(/parameters.corrections: present exactly when/);
    expect(() => loadModel({ ...json, schemaVersion: 5 })).toThrow(/parameters.corrections: present exactly when/);
    const damaged = JSON.parse(JSON.stringify(json));
    damaged.parameters.features.names[1] = damaged.parameters.features.names[0];
    expect(() => loadModel(damaged)).toThrow(/parameters.features: feature weights: feature names must be distinct/);
    const short = JSON.parse(JSON.stringify(json));
    short.parameters.features.names.pop();
    expect(() => loadModel(short)).toThrow(/parameters.features.weights.length/);
  });
});

describe("schema version 7", () => {
  it("a version-6 file (word clusters and word-type feature weights, written by the version-6 writer) loads and tags identically", () => {
    // model-v6.json: trained on the tiny corpus with --clusters 4 --perceptron 2
    // --perceptron-features word-type (and the tiny unlabelled text) by the version-6 code, with
    // the tags, chunk confidences and log-likelihoods it gave then (invented words only).
    const fixture = JSON.parse(readFileSync(fileURLToPath(new URL("../testing/model-v6.json", import.meta.url)), "utf8")) as {
      model: { schemaVersion: number; config: Record<string, unknown>; parameters: Record<string, unknown> };
      sentences: string[][];
      expected: { tags: string[]; chunks: { type: string; start: number; end: number; confidence: number }[]; logLikelihood: number }[];
    };
    expect(fixture.model.schemaVersion).toBe(6);
    expect(fixture.model.config.perceptronFeatures).toBe("word-type");
    expect(fixture.model.parameters.neighbourFeatures).toBeUndefined();
    const model = loadModel(fixture.model);
    expect(model.features).not.toBeNull();
    expect(model.neighbourFeatures).toBeNull();
    fixture.sentences.forEach((words, i) => expect(tagSentence(model, words)).toEqual(fixture.expected[i]));
    const again = loadModel(JSON.parse(JSON.stringify(serializeModel(model))));
    expect(serializeModel(again).schemaVersion).toBe(7);
    fixture.sentences.forEach((words, i) => expect(tagSentence(again, words)).toEqual(fixture.expected[i]));
  });

  it("stores the neighbour feature weights beside the word-type ones and refuses them when they disagree with the config or the version", () => {
    const json = serializeModel(trainTagger(tinyDocuments, { perceptron: 2, perceptronFeatures: "neighbours" }).model);
    expect(json.parameters.features!.names.length).toBeGreaterThan(0);
    expect(json.parameters.neighbourFeatures!.names.length).toBeGreaterThan(0);
    expect(() => loadModel({ ...json, config: { ...json.config, perceptronFeatures: "word-type" } })).toThrow(/parameters.neighbourFeatures: present exactly when/);
    expect(() => loadModel({ ...json, schemaVersion: 6 })).toThrow(/config: perceptronFeatures neighbours needs schema version 7, this file has 6/);
    const wordType = serializeModel(trainTagger(tinyDocuments, { perceptron: 2, perceptronFeatures: "word-type" }).model);
    expect(wordType.parameters.neighbourFeatures).toBeNull();
    expect(() => loadModel({ ...wordType, config: { ...wordType.config, perceptronFeatures: "neighbours" } })).toThrow(/parameters.neighbourFeatures: present exactly when/);
    const short = JSON.parse(JSON.stringify(json));
    short.parameters.neighbourFeatures.names.pop();
    expect(() => loadModel(short)).toThrow(/parameters.neighbourFeatures.weights.length/);
  });
});
