import { checkPositionBuckets, type PositionBuckets } from "./position-buckets";

/** Add-λ (Lidstone) constants, one per distribution. */
export type SmoothingConfig = {
  /** λ added to every start-state count. */
  readonly start: number;
  /** λ added to every transition count (and to the end count when the end state is on). */
  readonly transition: number;
  /** λ added to every (symbol, state) emission count. */
  readonly emission: number;
};

/** A pseudo-count that replaces λ for one transition cell, e.g. 0 for I-PER after O. */
export type TransitionPrior = { readonly from: string; readonly to: string; readonly count: number };

/** Every training option of the CLI and of {@link trainTagger}. */
export type TrainingConfig = {
  /** Tag scheme: `auto` detects IOB (every tag O/B-X/I-X) or plain tags from the data. */
  readonly scheme: "auto" | "iob" | "plain";
  readonly smoothing: SmoothingConfig;
  /** Per-cell pseudo-counts that override smoothing.transition. */
  readonly transitionPrior: readonly TransitionPrior[];
  /** IOB scheme only: forbid I-X at the start and after O or another type (IOB2 validity). */
  readonly constrainIob: boolean;
  /** Model P(end | last state), so that sentence ends inform the decoding. */
  readonly endState: boolean;
  /** Buckets for position-aware transitions; empty lists = position-free. */
  readonly positionBuckets: PositionBuckets;
  /** Prior strength β pulling each bucket's transitions toward the position-free estimate (pseudo-tokens). */
  readonly positionStrength: number;
  /** Words seen at most this often in training are modelled through their word class. */
  readonly rare: number;
  /** Read an unknown sentence-initial word as its lower-cased-initial form when that form is known. */
  readonly lowercaseFirstWord: boolean;
  /** Word-feature classes for unknown and rare words; `none` = one unknown-word symbol. */
  readonly wordClasses: "none" | "bikel" | "extended" | "informal";
  /** Longest suffix used for unknown words (Brants 2000 §2.3); 0 switches suffixes off. */
  readonly suffixLength: number;
  /** Words seen at most this often feed the suffix statistics (Brants 2000 §2.3). */
  readonly suffixMaxFrequency: number;
  /**
   * Successive-abstraction weight θ of the suffix statistics; null = Brants's formula (the
   * variance of the tag probabilities), which suits large POS tag sets but trusts sparse suffix
   * counts too much for a handful of entity tags.
   */
  readonly suffixTheta: number | null;
  /**
   * Emissions conditioned on context as in Bikel et al. (1997) §3.1: the first word of a segment
   * (B-X, or O after an entity) given the previous state, a word inside a segment given the
   * previous word; Witten–Bell back-off to P(word | state).
   */
  readonly contextEmissions: boolean;
  /** 1: first-order HMM; 2: second-order (trigram) transitions with deleted interpolation. */
  readonly order: 1 | 2;
  /** Transitions also conditioned on the previous word (Bikel et al. 1997), Witten–Bell back-off. */
  readonly prevWord: boolean;
  /** Emission lattice pruning for large tag sets (order 2): keep states within this factor of the best emission. */
  readonly beam: number;
  /** Learning from unlabelled documents after supervised training. */
  readonly semi: "none" | "em" | "sample";
  readonly iterations: number;
  /** Weight of the unlabelled (expected or sampled) counts relative to the labelled counts. */
  readonly weight: number;
  readonly seed: number;
  /**
   * Span-confidence calibration fitted on 5-fold cross-validation over the training documents
   * (Platt scaling, see platt.ts) and stored in the model; `platt-length` adds the log span length
   * as an input of the sigmoid (chosen by nested CV); `none` keeps the raw chunk marginals.
   */
  readonly calibration: "platt" | "platt-length" | "none";
  /**
   * Word clusters learned from the training text plus any unlabelled text (Brown et al. 1992 with
   * the window of Liang 2005, brown-clusters.ts) refine the emissions of unknown and rare words
   * (cluster-emissions.ts); the number of clusters, 0 = off.
   */
  readonly clusters: number;
  /**
   * Passes of the averaged perceptron (Collins 2002) that add discriminative weights to the
   * emission scores of the count model (perceptron.ts); 0 = off.
   */
  readonly perceptron: number;
  /**
   * What the perceptron's weights are on: `symbol`, one weight per (symbol, tag), first-order
   * only; `word-type`, weights per (feature, tag) of the word-type features of
   * word-type-features.ts (lower-cased form, affixes, shape, word class, flags, cluster prefixes);
   * `neighbours`, those plus features of the words around the token (neighbour-features.ts:
   * lower-cased w±1 and w±2, class and shape of w±1, sentence boundaries).
   */
  readonly perceptronFeatures: "symbol" | "word-type" | "neighbours";
  /** Reproduce NLTK's supervised HMM exactly (see nltk-compatible.ts); ignores the options above it names. */
  readonly nltkCompatible: boolean;
};

/**
 * Defaults: the settings chosen by 5-fold cross-validation over the documents of wikigold
 * train+dev (packages/tagger/bench/wikigold.ts prints the comparison); never tuned on test.
 */
export const DEFAULT_TRAINING_CONFIG: TrainingConfig = {
  scheme: "auto",
  smoothing: { start: 0.1, transition: 0.1, emission: 0.01 },
  transitionPrior: [],
  constrainIob: true,
  endState: true,
  positionBuckets: { token: [], sentence: [] },
  positionStrength: 10,
  rare: 4,
  lowercaseFirstWord: true,
  // informal ties extended under CV on wikigold train+dev (F1 0.5330 vs 0.5331, std 0.017; the
  // edited text has almost no handles, hashtags, URLs or emoticons) and is built for the chat
  // and post text extended cannot describe.
  wordClasses: "informal",
  suffixLength: 6,
  suffixMaxFrequency: 10,
  suffixTheta: 2,
  contextEmissions: true,
  order: 1,
  prevWord: true,
  beam: 1000,
  semi: "none",
  iterations: 5,
  weight: 0.1,
  seed: 1,
  // platt-length over platt and isotonic regression by nested 5-fold CV on wikigold train+dev
  // (pooled ECE over 5 article orders 0.0228 vs 0.0298 and 0.0255; bench/calibration.ts).
  calibration: "platt-length",
  clusters: 0,
  perceptron: 0,
  perceptronFeatures: "symbol",
  nltkCompatible: false,
};

/** Defaults overlaid with `partial` (smoothing merged per field); validated. */
export function resolveTrainingConfig(partial: Partial<TrainingConfig> = {}): TrainingConfig {
  const config: TrainingConfig = {
    ...DEFAULT_TRAINING_CONFIG,
    ...partial,
    smoothing: { ...DEFAULT_TRAINING_CONFIG.smoothing, ...(partial.smoothing ?? {}) },
    positionBuckets: partial.positionBuckets ?? DEFAULT_TRAINING_CONFIG.positionBuckets,
  };
  checkTrainingConfig(config);
  return config;
}

/** Throws RangeError naming the first invalid option. */
export function checkTrainingConfig(config: TrainingConfig): void {
  const nonNegative = (name: string, v: number) => {
    if (!(Number.isFinite(v) && v >= 0)) throw new RangeError(`${name} must be a finite number ≥ 0, got ${v}`);
  };
  nonNegative("smoothing.start", config.smoothing.start);
  nonNegative("smoothing.transition", config.smoothing.transition);
  nonNegative("smoothing.emission", config.smoothing.emission);
  nonNegative("positionStrength", config.positionStrength);
  nonNegative("weight", config.weight);
  for (const p of config.transitionPrior) nonNegative(`transition prior ${p.from}→${p.to}`, p.count);
  if (!["auto", "iob", "plain"].includes(config.scheme)) throw new RangeError(`scheme must be auto, iob or plain, got ${config.scheme}`);
  if (!Number.isInteger(config.rare) || config.rare < 0) throw new RangeError(`rare must be an integer ≥ 0, got ${config.rare}`);
  if (!["none", "bikel", "extended", "informal"].includes(config.wordClasses)) throw new RangeError(`wordClasses must be none, bikel, extended or informal, got ${config.wordClasses}`);
  if (!Number.isInteger(config.suffixLength) || config.suffixLength < 0) throw new RangeError(`suffixLength must be an integer ≥ 0, got ${config.suffixLength}`);
  if (!Number.isInteger(config.suffixMaxFrequency) || config.suffixMaxFrequency < 1) {
    throw new RangeError(`suffixMaxFrequency must be an integer ≥ 1, got ${config.suffixMaxFrequency}`);
  }
  if (config.suffixTheta !== null && !(Number.isFinite(config.suffixTheta) && config.suffixTheta >= 0)) {
    throw new RangeError(`suffixTheta must be null or a finite number ≥ 0, got ${config.suffixTheta}`);
  }
  if (config.order !== 1 && config.order !== 2) throw new RangeError(`order must be 1 or 2, got ${config.order}`);
  if (!(config.beam >= 1)) throw new RangeError(`beam must be ≥ 1, got ${config.beam}`);
  if (!["none", "em", "sample"].includes(config.semi)) throw new RangeError(`semi must be none, em or sample, got ${config.semi}`);
  if (!Number.isInteger(config.iterations) || config.iterations < 0) throw new RangeError(`iterations must be an integer ≥ 0, got ${config.iterations}`);
  if (config.calibration !== "platt" && config.calibration !== "platt-length" && config.calibration !== "none") throw new RangeError(`calibration must be platt, platt-length or none, got ${config.calibration}`);
  if (!Number.isInteger(config.clusters) || config.clusters < 0) throw new RangeError(`clusters must be an integer ≥ 0, got ${config.clusters}`);
  if (!Number.isInteger(config.perceptron) || config.perceptron < 0) throw new RangeError(`perceptron must be an integer ≥ 0, got ${config.perceptron}`);
  if (!["symbol", "word-type", "neighbours"].includes(config.perceptronFeatures)) throw new RangeError(`perceptronFeatures must be symbol, word-type or neighbours, got ${String(config.perceptronFeatures)}`);
  if (config.perceptron > 0 && config.order !== 1 && config.perceptronFeatures === "symbol") throw new RangeError("perceptron needs order 1");
  if (!Number.isInteger(config.seed)) throw new RangeError(`seed must be an integer, got ${config.seed}`);
  checkPositionBuckets(config.positionBuckets);
}
