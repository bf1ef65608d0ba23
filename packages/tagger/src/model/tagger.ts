import { isIobTag, tagsToChunks, type Chunk } from "../text/bio";
import type { ColumnDocument } from "../text/conll";
import { decodeSentence, sentencePosteriors } from "./decode";
import { nltkCompatibleConfig } from "../estimation/nltk-compatible";
import { createRng, type Rng } from "../util/random";
import { refineWithUnlabelled, type IterationReport } from "../semi-supervised/semi-supervised";
import { chunkConfidences, chunkConfidencesScaled } from "./span-confidence";
import { buildSentenceLattice, fastLatticeApplies, type SentenceLattice } from "./sentence-lattice";
import { scaledForwardBackwardColumns } from "../kernels/forward-backward-scaled-columns";
import { decodeViterbiColumns } from "../kernels/viterbi-columns";
import { assembleModel, type TaggerModel } from "./tagger-model";
import { prepareTrainingData } from "../estimation/training-data";
import { resolveTrainingConfig, type TrainingConfig } from "../estimation/training-config";
import { applyPlatt, fitPlatt, type PlattCalibration } from "../estimation/platt";
import { planFolds } from "../evaluation/folds";
import { trainEmissionCorrections, trainNeighbourWeights, trainWordTypeWeights } from "../estimation/perceptron";

/** Options of {@link trainTagger} that are not part of the model's configuration. */
export type TrainOptions = {
  /** Unlabelled documents → sentences → words, for config.semi = em | sample. */
  readonly unlabelled?: readonly (readonly (readonly string[])[])[];
  /** Generator for sampling; default createRng(config.seed). */
  readonly rng?: Rng;
  /** Clock in milliseconds for the iteration reports (the package reads no clock itself). */
  readonly now?: () => number;
  readonly onIteration?: (report: IterationReport) => void;
};

/**
 * Trains a tagger from labelled documents. `config` overrides the defaults (the cross-validated
 * best settings); with `nltkCompatible: true` every option NLTK's HMM lacks is switched off and
 * λ (`smoothing.emission`, default 0.1) is NLTK's Lidstone γ. With `semi` set and unlabelled
 * documents given, the supervised model is refined by EM or sampling, one report per iteration.
 * Inputs are not modified.
 */
export function trainTagger(
  documents: readonly ColumnDocument[],
  config: Partial<TrainingConfig> = {},
  options: TrainOptions = {},
): { model: TaggerModel; history: IterationReport[] } {
  const resolved = config.nltkCompatible === true ? nltkCompatibleConfig(config.smoothing?.emission ?? 0.1) : resolveTrainingConfig(config);
  const data = prepareTrainingData(documents, resolved, resolved.clusters > 0 ? (options.unlabelled ?? []).flat() : []);
  const calibration = resolved.calibration !== "none" && data.scheme === "iob" && !resolved.nltkCompatible ? fitSpanCalibration(documents, resolved) : null;
  const parts = {
    calibration,
    config: resolved,
    scheme: data.scheme,
    tags: data.tags,
    vocabulary: data.vocabulary,
    statistics: data.statistics,
    suffix: data.suffix,
    summary: data.summary,
    clusters: data.clusters,
  };
  const counted = assembleModel(parts);
  const countsOf = (others: readonly ColumnDocument[]) => trainTagger(others, { ...resolved, perceptron: 0, calibration: "none", semi: "none" }).model;
  const model = resolved.perceptron === 0 || resolved.nltkCompatible ? counted : withPerceptron(counted, parts, documents, resolved, countsOf);
  const unlabelled = options.unlabelled ?? [];
  if (resolved.semi === "none" || resolved.iterations === 0 || unlabelled.length === 0) return { model, history: [] };
  return refineWithUnlabelled(model, data.statistics, unlabelled, {
    method: resolved.semi,
    iterations: resolved.iterations,
    weight: resolved.weight,
    rng: options.rng ?? createRng(resolved.seed),
    now: options.now,
    onIteration: options.onIteration,
  });
}

/** The count model `counted` with the perceptron weights config.perceptronFeatures names. */
function withPerceptron(
  counted: TaggerModel,
  parts: Parameters<typeof assembleModel>[0],
  documents: readonly ColumnDocument[],
  config: TrainingConfig,
  countsOf: (documents: readonly ColumnDocument[]) => TaggerModel,
): TaggerModel {
  if (config.perceptronFeatures === "word-type") return assembleModel({ ...parts, features: trainWordTypeWeights(counted, documents, config.perceptron, countsOf) });
  if (config.perceptronFeatures === "neighbours") {
    const { wordType, neighbours } = trainNeighbourWeights(counted, documents, config.perceptron, countsOf);
    return assembleModel({ ...parts, features: wordType, neighbourFeatures: neighbours });
  }
  return assembleModel({ ...parts, corrections: trainEmissionCorrections(counted, documents, config.perceptron, countsOf) });
}

/** Folds of the cross-validation that fits the confidence calibration. */
const CALIBRATION_FOLDS = 5;

/**
 * Platt scaling fitted on the raw chunk marginals of CALIBRATION_FOLDS-fold cross-validation over
 * the training documents (each fold's model trained on the other folds, same configuration,
 * supervised only), with the log span length as an extra input for `platt-length`; null when
 * there are too few sentences for the folds or no predicted span.
 */
export function fitSpanCalibration(documents: readonly ColumnDocument[], config: TrainingConfig): PlattCalibration | null {
  if (documents.reduce((n, d) => n + d.sentences.length, 0) < CALIBRATION_FOLDS) return null;
  const plan = planFolds(documents, CALIBRATION_FOLDS);
  const inner: TrainingConfig = { ...config, calibration: "none", semi: "none" };
  const confidences: number[] = [];
  const correct: boolean[] = [];
  const lengths: number[] = [];
  plan.folds.forEach((heldOut, f) => {
    const train = plan.folds.filter((_, g) => g !== f).flat();
    if (train.every((d) => d.sentences.every((s) => s.words.length === 0))) return;
    const { model } = trainTagger(train, inner);
    for (const doc of heldOut) {
      doc.sentences.forEach((sentence, i) => {
        const gold = new Set(tagsToChunks(sentence.tags).map((c) => `${c.type} ${c.start} ${c.end}`));
        for (const c of tagSentence(model, sentence.words, { sentenceIndex: i }).chunks) {
          confidences.push(c.confidence);
          correct.push(gold.has(`${c.type} ${c.start} ${c.end}`));
          lengths.push(c.end - c.start);
        }
      });
    }
  });
  return confidences.length === 0 ? null : fitPlatt(confidences, correct, config.calibration === "platt-length" ? lengths : undefined);
}

/** A decoded entity chunk with its marginal probability. */
export type TaggedChunk = { readonly type: string; readonly start: number; readonly end: number; readonly confidence: number };

/** Output of {@link tagSentence}. */
export type TaggedSentenceResult = {
  readonly tags: string[];
  /** Entity chunks (iob scheme; empty for plain tags), token indices, end exclusive. */
  readonly chunks: TaggedChunk[];
  /** log P(words) under the model (natural log; forward algorithm). */
  readonly logLikelihood: number;
};

/**
 * Tags one sentence: Viterbi tags, the entity chunks they form with their confidence (marginal
 * probability of the chunk, see span-confidence.ts), and the sentence log-likelihood.
 * `sentenceIndex` is the sentence's index in its document (position-aware models use it).
 */
export function tagSentence(model: TaggerModel, words: readonly string[], options: { sentenceIndex?: number } = {}): TaggedSentenceResult {
  if (words.length === 0) return { tags: [], chunks: [], logLikelihood: 0 };
  const s = options.sentenceIndex ?? 0;
  if (fastLatticeApplies(model)) {
    const fast = tagSentenceFast(model, words);
    if (fast !== null) return fast;
  }
  const { path } = decodeSentence(model, words, s);
  const tags = Array.from(path, (k) => model.tags[k]);
  const { logLikelihood } = sentencePosteriors(model, words, s);
  if (model.scheme !== "iob") return { tags, chunks: [], logLikelihood };
  const chunks = tagsToChunks(tags);
  const confidences = calibrated(model, chunks, chunkConfidences(model, words, s, chunks, logLikelihood));
  return { tags, chunks: chunks.map((c, i) => ({ ...c, confidence: confidences[i] })), logLikelihood };
}

/** Raw chunk marginals through the model's calibration map (in place), if it has one. */
function calibrated(model: TaggerModel, chunks: readonly { start: number; end: number }[], confidences: number[]): number[] {
  const map = model.calibration;
  if (map !== null) for (let c = 0; c < confidences.length; c++) confidences[c] = applyPlatt(map, confidences[c], chunks[c].end - chunks[c].start);
  return confidences;
}

/**
 * Viterbi over a cached sentence lattice: the same scores and recursion as decodeSentence, on the
 * JavaScript kernel that reads the lattice's steps column by column (the WebAssembly one would
 * copy the cache's whole matrix array per sentence), into the lattice's reused buffers: the path
 * is lattice.path[0..T), valid until the next build.
 */
function decodeLattice(model: TaggerModel, lattice: SentenceLattice): Int32Array {
  const K = model.tags.length;
  const T = lattice.length;
  decodeViterbiColumns(K, T, lattice.logStart, lattice.logSteps, lattice.columns, lattice.logEmissions, model.parameters.end, lattice.path, lattice.viterbi, lattice.allowed);
  return lattice.path;
}

/** Per state of an iob model: 0 for O, 1 for B-X, 2 for I-X, and X (one string per type). */
type ChunkStates = { kind: Uint8Array; type: string[] } | null;
const chunkStateCache = new WeakMap<TaggerModel, ChunkStates>();

function chunkStatesOf(model: TaggerModel): ChunkStates {
  let states = chunkStateCache.get(model);
  if (states === undefined) {
    const types = new Map<string, string>();
    const kind = new Uint8Array(model.tags.length);
    const type: string[] = [];
    let valid = true;
    model.tags.forEach((tag, k) => {
      if (!isIobTag(tag)) valid = false;
      kind[k] = tag === "O" ? 0 : tag.charCodeAt(0) === 0x42 ? 1 : 2;
      const name = tag === "O" ? "" : tag.slice(2);
      if (!types.has(name)) types.set(name, name);
      type.push(types.get(name)!);
    });
    states = valid ? { kind, type } : null;
    chunkStateCache.set(model, states);
  }
  return states;
}

/**
 * tagsToChunks(tags) read off the state path (the same chunks, by the same conlleval rules,
 * without parsing tag strings); tags is the path's tag names, used when a tag is not IOB.
 */
function pathChunks(model: TaggerModel, path: Int32Array, T: number, tags: readonly string[]): Chunk[] {
  const states = chunkStatesOf(model);
  if (states === null) return tagsToChunks(tags);
  const { kind, type } = states;
  const chunks: Chunk[] = [];
  let openType: string | null = null;
  let openStart = 0;
  for (let i = 0; i < T; i++) {
    const k = path[i];
    if (kind[k] === 0) {
      if (openType !== null) chunks.push({ type: openType, start: openStart, end: i });
      openType = null;
      continue;
    }
    if (kind[k] === 1 || openType !== type[k]) {
      if (openType !== null) chunks.push({ type: openType, start: openStart, end: i });
      openType = type[k];
      openStart = i;
    }
  }
  if (openType !== null) chunks.push({ type: openType, start: openStart, end: T });
  return chunks;
}

/**
 * The tagging path of first-order models (see sentence-lattice.ts): one lattice build, Viterbi,
 * the chunks of its path, one scaled forward-backward (β̂ only from the earliest chunk end on,
 * the only β̂ the chunk probabilities read) and the chunk probabilities read off it. Null when
 * the scaled lattice underflows; the caller then takes the log-space path.
 */
function tagSentenceFast(model: TaggerModel, words: readonly string[]): TaggedSentenceResult | null {
  const K = model.tags.length;
  const lattice = buildSentenceLattice(model, words);
  const T = lattice.length;
  const path = decodeLattice(model, lattice);
  const tags = new Array<string>(T);
  for (let t = 0; t < T; t++) tags[t] = model.tags[path[t]];
  const iob = model.scheme === "iob";
  const chunks = iob ? pathChunks(model, path, T, tags) : [];
  let from = T - 1;
  for (let c = 0; c < chunks.length; c++) if (chunks[c].end < from) from = chunks[c].end;
  const logLikelihood = scaledForwardBackwardColumns(K, T, lattice.start, lattice.steps, lattice.columns, lattice.emissions, lattice.end, lattice.scaled, from, lattice.allowed);
  if (Number.isNaN(logLikelihood)) return null;
  if (!iob) return { tags, chunks: [], logLikelihood };
  const confidences = calibrated(model, chunks, chunkConfidencesScaled(model, chunks, T, lattice.start, lattice.steps, lattice.columns, lattice.emissions, lattice.end, lattice.scaled));
  return { tags, chunks: chunks.map((c, i) => ({ type: c.type, start: c.start, end: c.end, confidence: confidences[i] })), logLikelihood };
}

/** Viterbi tags of every sentence of a document (no posteriors: the fast path for evaluation). */
export function tagDocument(model: TaggerModel, sentences: readonly (readonly string[])[]): string[][] {
  const fast = fastLatticeApplies(model);
  return sentences.map((words, s) => {
    if (words.length === 0) return [];
    const path = fast ? decodeLattice(model, buildSentenceLattice(model, words)) : decodeSentence(model, words, s).path;
    const tags = new Array<string>(words.length);
    for (let t = 0; t < words.length; t++) tags[t] = model.tags[path[t]];
    return tags;
  });
}
