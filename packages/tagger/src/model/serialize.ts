import { addCount, createCountTable, findEntry, type CountTable } from "../estimation/count-table";
import { createSuffixStatistics, suffixNodesToJson, type SuffixNode } from "../estimation/suffix-model";
import { createSufficientStatistics, type SufficientStatistics } from "../estimation/sufficient-statistics";
import { assembleModel, type DataSummary, type TaggerModel } from "./tagger-model";
import { resolveTrainingConfig, type TrainingConfig } from "../estimation/training-config";
import { createVocabulary, symbolCount } from "../estimation/vocabulary";
import type { PlattCalibration } from "../estimation/platt";
import { createWordClusters } from "../estimation/brown-clusters";
import { createClusterEmissions, type ClusterEmissions } from "../estimation/cluster-emissions";
import { createFeatureWeights, type FeatureWeights } from "../estimation/word-type-features";

/** Identifies a serialized tagger; `schemaVersion` changes whenever the file's meaning does. */
export const MODEL_FORMAT = "tagloom-hmm";
export const MODEL_SCHEMA_VERSION = 7;
/**
 * Versions this release reads: version 1 had no calibration (raw chunk marginals); version 2
 * could not name the `informal` word classes (version 3); version 3's calibration had no span
 * length coefficient `c` (version 4; an older file reads with c = 0, i.e. as before); versions
 * 1–4 had no word clusters (version 5; an older file reads with clusters off, i.e. as before);
 * versions 1–5 had no word-type feature weights (version 6; an older file's perceptron, if any,
 * has symbol weights, and it reads and tags as before); versions 1–6 had no neighbour-feature
 * weights (version 7; an older file's perceptron has symbol or word-type weights only).
 */
const READABLE_VERSIONS = [1, 2, 3, 4, 5, 6, 7];

/** A dense array stored by its non-zero entries. */
export type SparseArray = { length: number; indices: number[]; values: number[] };

/**
 * The JSON form of a model. `parameters` holds the sufficient statistics (counts, possibly
 * fractional after EM) and the suffix statistics; every probability is a deterministic function of
 * them and of `config`, so loading re-estimates bit-identical parameters and predictions.
 */
export type SerializedModel = {
  format: typeof MODEL_FORMAT;
  schemaVersion: typeof MODEL_SCHEMA_VERSION;
  scheme: "iob" | "plain";
  tags: string[];
  vocabulary: { words: string[]; classes: string[]; wordClasses: TrainingConfig["wordClasses"] };
  config: TrainingConfig;
  summary: DataSummary;
  /** Span-confidence calibration (Platt scaling, a and b; version 2), c on ln(span length) (version 4), or null. */
  calibration: { method: "platt"; a: number; b: number; c: number } | null;
  parameters: {
    kind: "sufficient-statistics";
    states: number;
    symbols: number;
    buckets: number;
    sentenceBuckets: number;
    tokens: number;
    sentences: number;
    start: SparseArray;
    transitions: SparseArray;
    end: SparseArray;
    emissions: SparseArray;
    prevWord: Array<[number, number]> | null;
    trigrams: Array<[number, number]> | null;
    contextEmissions: Array<[number, number]> | null;
    suffix: { maxLength: number; theta: number; nodes: Array<[string, number[], number[]]> } | null;
    /**
     * Word clusters (version 5): clustered words, each word's cluster, each cluster's bit string,
     * and the tag counts of the bit-string prefixes per word class (nodes as in `suffix`, keyed by
     * the reversed prefix).
     */
    clusters: { words: string[]; cluster: number[]; paths: string[]; maxLength: number; theta: number; nodes: Array<[string, number[], number[]]> } | null;
    /** Perceptron weights added to the emission scores, S×K symbol-major (version 5; absent = none). */
    corrections?: SparseArray | null;
    /**
     * Perceptron weights of the word-type features (version 6; absent = none): feature strings
     * in id order and their F×K weights, feature-major.
     */
    features?: { names: string[]; weights: SparseArray } | null;
    /**
     * Perceptron weights of the neighbouring words' features (version 7; absent = none), stored
     * as `features`; with them `features` holds the word-type part of the same perceptron.
     */
    neighbourFeatures?: { names: string[]; weights: SparseArray } | null;
    /** Informational: values estimated from the counts (recomputed on load). */
    derived: { trigramLambdas: number[] | null };
  };
};

function toSparse(values: Float64Array): SparseArray {
  const indices: number[] = [];
  const out: number[] = [];
  for (let i = 0; i < values.length; i++) {
    if (values[i] !== 0) {
      indices.push(i);
      out.push(values[i]);
    }
  }
  return { length: values.length, indices, values: out };
}

/** Entries in insertion order: estimation sums them in that order, so keeping it keeps sums bit-identical. */
function mapEntries(table: CountTable | null): Array<[number, number]> | null {
  if (table === null) return null;
  const out: Array<[number, number]> = [];
  for (let e = 0; e < table.size; e++) if (table.values[e] !== 0) out.push([table.keys[e], table.values[e]]);
  return out;
}

/** The model as a plain JSON-compatible object (see SerializedModel). */
export function serializeModel(model: TaggerModel): SerializedModel {
  const s = model.statistics;
  return {
    format: MODEL_FORMAT,
    schemaVersion: MODEL_SCHEMA_VERSION,
    scheme: model.scheme,
    tags: [...model.tags],
    vocabulary: { words: [...model.vocabulary.words], classes: [...model.vocabulary.classes], wordClasses: model.vocabulary.scheme },
    config: JSON.parse(JSON.stringify(model.config)) as TrainingConfig,
    summary: JSON.parse(JSON.stringify(model.summary)) as DataSummary,
    calibration: model.calibration === null ? null : { method: "platt", a: model.calibration.a, b: model.calibration.b, c: model.calibration.c },
    parameters: {
      kind: "sufficient-statistics",
      states: s.states,
      symbols: s.symbols,
      buckets: s.buckets,
      sentenceBuckets: s.sentenceBuckets,
      tokens: s.tokens,
      sentences: s.sentences,
      start: toSparse(s.start),
      transitions: toSparse(s.transitions),
      end: toSparse(s.end),
      emissions: toSparse(s.emissions),
      prevWord: mapEntries(s.prevWord),
      trigrams: mapEntries(s.trigrams),
      contextEmissions: mapEntries(s.contextEmissions),
      suffix: model.suffix === null ? null : { maxLength: model.suffix.maxLength, theta: model.suffix.theta, nodes: suffixNodesToJson(model.suffix) },
      clusters: model.clusters === null ? null : clustersToJson(model.clusters),
      corrections: model.corrections === null ? null : toSparse(model.corrections),
      features: model.features === null ? null : featuresToJson(model.features),
      neighbourFeatures: model.neighbourFeatures === null ? null : featuresToJson(model.neighbourFeatures),
      derived: { trigramLambdas: model.parameters.trigram === null ? null : [...model.parameters.trigram.lambdas] },
    },
  };
}

function featuresToJson(table: FeatureWeights): { names: string[]; weights: SparseArray } {
  return { names: [...table.names], weights: toSparse(table.weights) };
}

function clustersToJson(c: ClusterEmissions): NonNullable<SerializedModel["parameters"]["clusters"]> {
  return {
    words: [...c.clusters.words],
    cluster: Array.from(c.clusters.cluster),
    paths: [...c.clusters.paths],
    maxLength: c.statistics.maxLength,
    theta: c.statistics.theta,
    nodes: suffixNodesToJson(c.statistics),
  };
}

/** A model file that cannot be loaded; `path` names the offending field. */
export class ModelFormatError extends TypeError {
  override readonly name = "ModelFormatError";
  constructor(
    readonly path: string,
    reason: string,
  ) {
    super(`model file: ${path}: ${reason}`);
  }
}

type Json = Record<string, unknown>;

function object(value: unknown, path: string): Json {
  if (typeof value !== "object" || value === null || Array.isArray(value)) throw new ModelFormatError(path, "expected an object");
  return value as Json;
}
function array(value: unknown, path: string): unknown[] {
  if (!Array.isArray(value)) throw new ModelFormatError(path, "expected an array");
  return value;
}
function integer(value: unknown, path: string, min = 0): number {
  if (typeof value !== "number" || !Number.isInteger(value) || value < min) throw new ModelFormatError(path, `expected an integer ≥ ${min}`);
  return value;
}
function finite(value: unknown, path: string): number {
  if (typeof value !== "number" || !Number.isFinite(value)) throw new ModelFormatError(path, "expected a finite number");
  return value;
}
function strings(value: unknown, path: string): string[] {
  return array(value, path).map((x, i) => {
    if (typeof x !== "string") throw new ModelFormatError(`${path}[${i}]`, "expected a string");
    return x;
  });
}

function fromSparse(value: unknown, length: number, path: string): Float64Array {
  const o = object(value, path);
  if (integer(o.length, `${path}.length`) !== length) throw new ModelFormatError(`${path}.length`, `expected ${length}, got ${String(o.length)}`);
  const indices = array(o.indices, `${path}.indices`);
  const values = array(o.values, `${path}.values`);
  if (indices.length !== values.length) throw new ModelFormatError(path, `${indices.length} indices but ${values.length} values`);
  const out = new Float64Array(length);
  indices.forEach((index, n) => {
    const i = integer(index, `${path}.indices[${n}]`);
    if (i >= length) throw new ModelFormatError(`${path}.indices[${n}]`, `${i} outside length ${length}`);
    out[i] = finite(values[n], `${path}.values[${n}]`);
  });
  return out;
}

function fromEntries(value: unknown, path: string, limit: number): CountTable | null {
  if (value === null) return null;
  const table = createCountTable(Array.isArray(value) ? value.length : 0);
  array(value, path).forEach((entry, n) => {
    const pair = array(entry, `${path}[${n}]`);
    const key = integer(pair[0], `${path}[${n}][0]`);
    if (key >= limit) throw new ModelFormatError(`${path}[${n}][0]`, `key ${key} outside the table (${limit})`);
    if (findEntry(table, key) >= 0) throw new ModelFormatError(`${path}[${n}][0]`, `key ${key} appears twice`);
    addCount(table, key, finite(pair[1], `${path}[${n}][1]`));
  });
  return table;
}

/**
 * Reads a serialized model (parsed JSON). Refuses another format or schema version with a clear
 * error, validates every shape (ModelFormatError naming the field), then re-estimates the
 * parameters exactly as training did, so predictions are identical.
 */
export function loadModel(json: unknown): TaggerModel {
  const root = object(json, "(root)");
  if (root.format !== MODEL_FORMAT) throw new ModelFormatError("format", `expected "${MODEL_FORMAT}", got ${JSON.stringify(root.format)}: not a Tagloom tagger model`);
  if (typeof root.schemaVersion !== "number" || !READABLE_VERSIONS.includes(root.schemaVersion)) {
    throw new ModelFormatError(
      "schemaVersion",
      `unsupported schema version ${JSON.stringify(root.schemaVersion)}; this version of @tagloom/tagger reads versions ${READABLE_VERSIONS.slice(0, -1).join(", ")} and ${READABLE_VERSIONS[READABLE_VERSIONS.length - 1]} (retrain the model or use a matching release)`,
    );
  }
  const version = root.schemaVersion;
  const scheme = root.scheme;
  if (scheme !== "iob" && scheme !== "plain") throw new ModelFormatError("scheme", `expected "iob" or "plain", got ${JSON.stringify(scheme)}`);
  const tags = strings(root.tags, "tags");
  if (tags.length === 0 || new Set(tags).size !== tags.length) throw new ModelFormatError("tags", "expected a non-empty list of distinct tags");
  let config: TrainingConfig;
  try {
    const stored = object(root.config, "config") as Partial<TrainingConfig>;
    // Version 1 predates calibration and versions 1–4 clusters: such a model was trained without them.
    // Versions 1–5 predate word-type features: a perceptron there has symbol weights.
    const older = version < 5 ? { ...stored, clusters: 0, perceptron: 0 } : version < 6 ? { ...stored, perceptronFeatures: "symbol" as const } : stored;
    if (version < 7 && older.perceptronFeatures === "neighbours") throw new RangeError(`perceptronFeatures neighbours needs schema version 7, this file has ${version}`);
    config = resolveTrainingConfig(version === 1 ? { ...older, calibration: "none" } : older);
  } catch (error) {
    throw new ModelFormatError("config", (error as Error).message);
  }
  const vocabularyJson = object(root.vocabulary, "vocabulary");
  const wordClasses = vocabularyJson.wordClasses;
  if (wordClasses !== "none" && wordClasses !== "bikel" && wordClasses !== "extended" && (wordClasses !== "informal" || version < 3)) {
    throw new ModelFormatError("vocabulary.wordClasses", `expected none, bikel, extended${version >= 3 ? " or informal" : ` (informal needs schema version 3, this file has ${version})`}`);
  }
  let vocabulary;
  try {
    vocabulary = createVocabulary(strings(vocabularyJson.words, "vocabulary.words"), wordClasses, config.lowercaseFirstWord);
  } catch (error) {
    throw new ModelFormatError("vocabulary.words", (error as Error).message);
  }
  const classes = strings(vocabularyJson.classes, "vocabulary.classes");
  if (classes.join("\u0000") !== vocabulary.classes.join("\u0000")) throw new ModelFormatError("vocabulary.classes", "word classes differ from this version's; retrain the model");

  const p = object(root.parameters, "parameters");
  if (p.kind !== "sufficient-statistics") throw new ModelFormatError("parameters.kind", `expected "sufficient-statistics"`);
  const K = integer(p.states, "parameters.states", 1);
  const S = integer(p.symbols, "parameters.symbols", 1);
  const B = integer(p.buckets, "parameters.buckets", 1);
  const SB = integer(p.sentenceBuckets, "parameters.sentenceBuckets", 1);
  if (K !== tags.length) throw new ModelFormatError("parameters.states", `${K} states for ${tags.length} tags`);
  if (S !== symbolCount(vocabulary)) throw new ModelFormatError("parameters.symbols", `${S} symbols for a vocabulary of ${symbolCount(vocabulary)}`);
  const expectedBuckets = (config.positionBuckets.token.length + 1) * (config.positionBuckets.sentence.length + 1);
  if (B !== expectedBuckets || SB !== config.positionBuckets.sentence.length + 1) throw new ModelFormatError("parameters.buckets", "bucket counts disagree with config.positionBuckets");
  const stats: SufficientStatistics = {
    ...createSufficientStatistics({ states: K, symbols: S, buckets: B, sentenceBuckets: SB, prevWord: false, trigrams: false, contextEmissions: false }),
    start: fromSparse(p.start, SB * K, "parameters.start"),
    transitions: fromSparse(p.transitions, B * K * K, "parameters.transitions"),
    end: fromSparse(p.end, K, "parameters.end"),
    emissions: fromSparse(p.emissions, S * K, "parameters.emissions"),
    prevWord: fromEntries(p.prevWord, "parameters.prevWord", S * K * K),
    trigrams: fromEntries(p.trigrams, "parameters.trigrams", (K + 1) ** 3),
    contextEmissions: fromEntries(p.contextEmissions, "parameters.contextEmissions", (K + 1 + S) * K * S),
    tokens: finite(p.tokens, "parameters.tokens"),
    sentences: finite(p.sentences, "parameters.sentences"),
  };
  if ((stats.prevWord !== null) !== config.prevWord) throw new ModelFormatError("parameters.prevWord", "present exactly when config.prevWord is on");
  if ((stats.trigrams !== null) !== (config.order === 2)) throw new ModelFormatError("parameters.trigrams", "present exactly when config.order is 2");
  if ((stats.contextEmissions !== null) !== config.contextEmissions) throw new ModelFormatError("parameters.contextEmissions", "present exactly when config.contextEmissions is on");

  const suffix = p.suffix === null || p.suffix === undefined ? null : readSuffixStatistics(p.suffix, "parameters.suffix", K);
  let clusters: ClusterEmissions | null = null;
  if (version >= 5 && p.clusters !== null) {
    const cj = object(p.clusters, "parameters.clusters");
    let wordClusters;
    try {
      wordClusters = createWordClusters(
        strings(cj.words, "parameters.clusters.words"),
        Int32Array.from(array(cj.cluster, "parameters.clusters.cluster"), (x, i) => integer(x, `parameters.clusters.cluster[${i}]`)),
        strings(cj.paths, "parameters.clusters.paths"),
      );
    } catch (error) {
      throw new ModelFormatError("parameters.clusters", (error as Error).message);
    }
    clusters = createClusterEmissions(wordClusters, readSuffixStatistics(cj, "parameters.clusters", K));
  }
  const corrections = version >= 5 && p.corrections !== undefined && p.corrections !== null ? fromSparse(p.corrections, S * K, "parameters.corrections") : null;
  const perceptronOn = config.perceptron > 0 && !config.nltkCompatible;
  if ((corrections !== null) !== (perceptronOn && config.perceptronFeatures === "symbol")) throw new ModelFormatError("parameters.corrections", "present exactly when config.perceptron is above 0 with symbol features");
  const features = version >= 6 ? readFeatureWeights(p.features, "parameters.features", K) : null;
  const neighbourFeatures = version >= 7 ? readFeatureWeights(p.neighbourFeatures, "parameters.neighbourFeatures", K) : null;
  const withWordType = perceptronOn && (config.perceptronFeatures === "word-type" || config.perceptronFeatures === "neighbours");
  if ((features !== null) !== withWordType) throw new ModelFormatError("parameters.features", "present exactly when config.perceptron is above 0 with word-type or neighbour features");
  if ((neighbourFeatures !== null) !== (perceptronOn && config.perceptronFeatures === "neighbours")) {
    throw new ModelFormatError("parameters.neighbourFeatures", "present exactly when config.perceptron is above 0 with neighbour features");
  }
  if ((clusters !== null) !== (config.clusters > 0)) throw new ModelFormatError("parameters.clusters", "present exactly when config.clusters is above 0");
  const summary = object(root.summary, "summary") as unknown as DataSummary;
  let calibration: PlattCalibration | null = null;
  if (version >= 2 && root.calibration !== null) {
    const c = object(root.calibration, "calibration");
    if (c.method !== "platt") throw new ModelFormatError("calibration.method", `expected "platt", got ${JSON.stringify(c.method)}`);
    calibration = { method: "platt", a: finite(c.a, "calibration.a"), b: finite(c.b, "calibration.b"), c: version >= 4 ? finite(c.c, "calibration.c") : 0 };
  }
  return assembleModel({ config, scheme, tags, vocabulary, statistics: stats, suffix, summary, calibration, clusters, corrections, features, neighbourFeatures });
}

/** A feature table stored as {names, weights} (F×K, feature-major), or null when absent. */
function readFeatureWeights(value: unknown, at: string, K: number): FeatureWeights | null {
  if (value === undefined || value === null) return null;
  const fj = object(value, at);
  const names = strings(fj.names, `${at}.names`);
  try {
    return createFeatureWeights(names, fromSparse(fj.weights, names.length * K, `${at}.weights`), K);
  } catch (error) {
    if (error instanceof ModelFormatError) throw error;
    throw new ModelFormatError(at, (error as Error).message);
  }
}

/** Suffix-model statistics stored as {maxLength, theta, nodes} (the suffix table and the cluster prefixes). */
function readSuffixStatistics(value: unknown, at: string, K: number) {
  const sj = object(value, at);
  const nodes = array(sj.nodes, `${at}.nodes`).map((entry, n): [string, SuffixNode] => {
    const path = `${at}.nodes[${n}]`;
    const triple = array(entry, path);
    if (typeof triple[0] !== "string") throw new ModelFormatError(`${path}[0]`, "expected a string key");
    const nodeTags = array(triple[1], `${path}[1]`).map((x, i) => {
      const k = integer(x, `${path}[1][${i}]`);
      if (k >= K) throw new ModelFormatError(`${path}[1][${i}]`, `tag ${k} outside K=${K}`);
      return k;
    });
    const nodeCounts = array(triple[2], `${path}[2]`).map((x, i) => finite(x, `${path}[2][${i}]`));
    if (nodeTags.length !== nodeCounts.length) throw new ModelFormatError(path, "tags and counts differ in length");
    const counts = Float64Array.from(nodeCounts);
    return [triple[0], { tags: Int32Array.from(nodeTags), counts, total: counts.reduce((a, b) => a + b, 0) }];
  });
  return createSuffixStatistics(K, integer(sj.maxLength, `${at}.maxLength`), finite(sj.theta, `${at}.theta`), nodes);
}
