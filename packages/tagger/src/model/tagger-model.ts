import type { TagScheme } from "../text/conll";
import { segmentStartTable } from "../estimation/context-emissions";
import { estimateParameters, type ModelParameters } from "../estimation/estimate";
import { iobConstraints, type IobConstraints } from "../text/iob-constraints";
import { buildNltkTables, type NltkTables } from "../estimation/nltk-compatible";
import type { SuffixStatistics } from "../estimation/suffix-model";
import type { SufficientStatistics } from "../estimation/sufficient-statistics";
import type { TrainingConfig } from "../estimation/training-config";
import type { PlattCalibration } from "../estimation/platt";
import { symbolCount, type Vocabulary } from "../estimation/vocabulary";
import type { ClusterEmissions } from "../estimation/cluster-emissions";
import type { FeatureWeights } from "../estimation/word-type-features";

/** What the model was trained on (stored with it). */
export type DataSummary = {
  readonly documents: number;
  readonly sentences: number;
  readonly tokens: number;
  /** Training tokens per tag (IOB2 tags for the iob scheme). */
  readonly tagCounts: Readonly<Record<string, number>>;
  readonly unlabelledDocuments: number;
  readonly unlabelledSentences: number;
  readonly unlabelledTokens: number;
};

/**
 * A trained tagger: plain readonly data. `statistics` are the counts the parameters were estimated
 * from (labelled counts plus weighted unlabelled counts after EM or sampling); `parameters` are a
 * deterministic function of them and of `config`.
 */
export type TaggerModel = {
  readonly config: TrainingConfig;
  readonly scheme: TagScheme;
  /** State names in state-id order (order of first appearance in training). */
  readonly tags: readonly string[];
  readonly vocabulary: Vocabulary;
  readonly statistics: SufficientStatistics;
  readonly parameters: ModelParameters;
  readonly suffix: SuffixStatistics | null;
  readonly constraints: IobConstraints | null;
  readonly summary: DataSummary;
  /** NLTK's float32 decoding tables, only for the NLTK-compatible configuration. */
  readonly nltk: NltkTables | null;
  /** K×K segment starts for context-conditioned emissions (context-emissions.ts), else null. */
  readonly segmentStarts: Uint8Array | null;
  /** Map from raw chunk marginals to calibrated span confidences, or null (raw marginals). */
  readonly calibration: PlattCalibration | null;
  /** Word clusters for unknown and rare words (config.clusters > 0), else null. */
  readonly clusters: ClusterEmissions | null;
  /** S×K perceptron weights added to the emission scores (config.perceptron > 0), else null. */
  readonly corrections: Float64Array | null;
  /** Perceptron weights of the word-type features (config.perceptronFeatures word-type), else null. */
  readonly features: FeatureWeights | null;
  /** Perceptron weights of the neighbouring words' features (config.perceptronFeatures neighbours), else null. */
  readonly neighbourFeatures: FeatureWeights | null;
};

/** Pseudo-count tables implied by the config: λ everywhere, overrides, 0 where IOB2 forbids. */
function priorTables(config: TrainingConfig, tags: readonly string[], constraints: IobConstraints | null): { transition: Float64Array | null; start: Float64Array | null } {
  const K = tags.length;
  if (config.transitionPrior.length === 0 && constraints === null) return { transition: null, start: null };
  const transition = new Float64Array(K * K).fill(config.smoothing.transition);
  const start = new Float64Array(K).fill(config.smoothing.start);
  const index = new Map(tags.map((t, i) => [t, i]));
  for (const { from, to, count } of config.transitionPrior) {
    const i = index.get(from);
    const j = index.get(to);
    if (i === undefined || j === undefined) throw new RangeError(`transition prior ${from}→${to}: tag not in the training data`);
    transition[i * K + j] = count;
  }
  if (constraints !== null) {
    for (let x = 0; x < K * K; x++) if (constraints.allowed[x] === 0) transition[x] = 0;
    for (let k = 0; k < K; k++) if (constraints.allowedStart[k] === 0) start[k] = 0;
  }
  return { transition, start };
}

/** Assembles a model, estimating its parameters from its statistics (the single estimation path). */
export function assembleModel(parts: {
  config: TrainingConfig;
  scheme: TagScheme;
  tags: readonly string[];
  vocabulary: Vocabulary;
  statistics: SufficientStatistics;
  suffix: SuffixStatistics | null;
  summary: DataSummary;
  calibration?: PlattCalibration | null;
  clusters?: ClusterEmissions | null;
  corrections?: Float64Array | null;
  features?: FeatureWeights | null;
  neighbourFeatures?: FeatureWeights | null;
}): TaggerModel {
  const { config, tags, vocabulary, statistics } = parts;
  if (statistics.states !== tags.length) throw new RangeError(`statistics have K=${statistics.states} states for ${tags.length} tags`);
  if (statistics.symbols !== symbolCount(vocabulary)) {
    throw new RangeError(`statistics have S=${statistics.symbols} symbols, vocabulary ${symbolCount(vocabulary)}`);
  }
  const constraints = parts.scheme === "iob" && config.constrainIob && !config.nltkCompatible ? iobConstraints(tags) : null;
  const priors = priorTables(config, tags, constraints);
  const parameters = estimateParameters(statistics, {
    smoothing: config.smoothing,
    transitionPrior: priors.transition,
    startPrior: priors.start,
    endState: config.endState && !config.nltkCompatible,
    positionStrength: config.positionStrength,
    // NLTK's Lidstone emission uses the training word types as bins; the unknown-word symbol is extra.
    emissionBins: config.nltkCompatible ? vocabulary.words.length : symbolCount(vocabulary),
  });
  const nltk = config.nltkCompatible ? buildNltkTables(statistics, config.smoothing.emission, vocabulary.words.length) : null;
  const segmentStarts = statistics.contextEmissions === null ? null : segmentStartTable(tags, parts.scheme);
  return { ...parts, calibration: parts.calibration ?? null, clusters: parts.clusters ?? null, corrections: parts.corrections ?? null, features: parts.features ?? null, neighbourFeatures: parts.neighbourFeatures ?? null, parameters, constraints, nltk, segmentStarts };
}
