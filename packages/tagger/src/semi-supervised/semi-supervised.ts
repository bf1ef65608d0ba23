import { addCount } from "../estimation/count-table";
import { emissionContext } from "../estimation/context-emissions";
import { buildFirstOrderProblem } from "../model/decode-input";
import { accumulateTransitionPosteriors, computePosteriors } from "../kernels/forward-backward";
import { computeForward } from "../kernels/forward";
import { transitionMatrixCount } from "../kernels/hmm-params";
import { fillTransitionBuckets, sentenceBucketOf } from "../estimation/position-buckets";
import type { Rng } from "../util/random";
import { sampleStatePath } from "../kernels/sampling";
import { addStatistics, createSufficientStatistics, statisticsSize, type SufficientStatistics } from "../estimation/sufficient-statistics";
import { assembleModel, type TaggerModel } from "../model/tagger-model";

/** One iteration of EM or sampling, as reported to the caller. */
export type IterationReport = {
  readonly iteration: number;
  readonly method: "em" | "sample";
  /** Σ log P(unlabelled sentence) under the model the iteration started from (natural log). */
  readonly logLikelihood: number;
  /** Wall time of the iteration measured with the caller's clock, or null without one. */
  readonly seconds: number | null;
  /** Non-zero cells of the statistics the iteration accumulated. */
  readonly statisticsCells: number;
  /** Bytes to hold them: dense arrays for expected counts, sparse entries for sampled counts. */
  readonly statisticsBytes: number;
};

/** Options of {@link refineWithUnlabelled}. */
export type RefineOptions = {
  readonly method: "em" | "sample";
  readonly iterations: number;
  /** Weight of the unlabelled counts relative to the labelled ones. */
  readonly weight: number;
  /** Required for sampling. */
  readonly rng?: Rng;
  /** Milliseconds from an arbitrary origin (e.g. performance.now); the package never reads a clock itself. */
  readonly now?: () => number;
  readonly onIteration?: (report: IterationReport) => void;
};

/**
 * Counts one unlabelled sentence into `target`: expected counts (E-step of Baum–Welch, Rabiner
 * 1989 §III-C) or the integer counts of one state sequence drawn by forward filtering, backward
 * sampling. Returns log P(words).
 */
function countUnlabelledSentence(model: TaggerModel, words: readonly string[], sentenceIndex: number, target: SufficientStatistics, method: "em" | "sample", rng: Rng | undefined): number {
  const K = model.tags.length;
  const KK = K * K;
  const T = words.length;
  const { params, input, symbols } = buildFirstOrderProblem(model, words, sentenceIndex);
  const config = model.config;
  const sb = sentenceBucketOf(config.positionBuckets, sentenceIndex);
  const buckets = target.buckets > 1 ? fillTransitionBuckets(config.positionBuckets, T, sentenceIndex, new Int32Array(T)) : null;
  // buildFirstOrderProblem gives every step its own matrix when either table is on.
  const perStep = (model.parameters.prevWord !== null || model.parameters.contextEmission !== null) && T >= 2;
  const S = target.symbols;
  const segmentStarts = model.segmentStarts;
  const addContextEmission = (t: number, i: number, j: number, weight: number) => {
    if (target.contextEmissions === null || segmentStarts === null) return;
    const context = t === 0 ? K : emissionContext(segmentStarts, K, i, j, symbols[t - 1]);
    const key = (context * K + j) * S + symbols[t];
    addCount(target.contextEmissions, key, weight);
  };
  const bucketOf = (t: number) => (buckets === null ? 0 : buckets[t]);
  if (method === "em") {
    const post = computePosteriors(params, input);
    const { posteriors } = post;
    for (let k = 0; k < K; k++) {
      target.start[sb * K + k] += posteriors[k];
      target.end[k] += posteriors[(T - 1) * K + k];
    }
    for (let t = 0; t < T; t++) for (let k = 0; k < K; k++) target.emissions[symbols[t] * K + k] += posteriors[t * K + k];
    for (let k = 0; k < K; k++) if (posteriors[k] > 0) addContextEmission(0, K, k, posteriors[k]);
    if (T >= 2) {
      const xi = new Float64Array(transitionMatrixCount(params) * KK);
      accumulateTransitionPosteriors(params, input, post, 1, xi, null, null);
      if (!perStep) {
        for (let x = 0; x < xi.length; x++) target.transitions[x] += xi[x];
      } else {
        for (let t = 1; t < T; t++) {
          const b = bucketOf(t) * KK;
          for (let x = 0; x < KK; x++) {
            const v = xi[t * KK + x];
            if (v === 0) continue;
            target.transitions[b + x] += v;
            if (target.prevWord !== null) {
              const key = symbols[t - 1] * KK + x;
              addCount(target.prevWord, key, v);
            }
            addContextEmission(t, Math.floor(x / K), x % K, v);
          }
        }
      }
    }
    target.tokens += T;
    target.sentences += 1;
    return post.logLikelihood;
  }
  if (rng === undefined) throw new RangeError("sampling needs a seeded generator (options.rng)");
  const { alpha, logLikelihood } = computeForward(params, input);
  const path = sampleStatePath(params, input, alpha, rng);
  target.start[sb * K + path[0]] += 1;
  target.end[path[T - 1]] += 1;
  for (let t = 0; t < T; t++) target.emissions[symbols[t] * K + path[t]] += 1;
  addContextEmission(0, K, path[0], 1);
  for (let t = 1; t < T; t++) {
    addContextEmission(t, path[t - 1], path[t], 1);
    target.transitions[bucketOf(t) * KK + path[t - 1] * K + path[t]] += 1;
    if (target.prevWord !== null) {
      const key = (symbols[t - 1] * K + path[t - 1]) * K + path[t];
      addCount(target.prevWord, key, 1);
    }
  }
  target.tokens += T;
  target.sentences += 1;
  return logLikelihood;
}

/**
 * Learning from unlabelled documents (documents → sentences → words), starting from a supervised
 * model whose labelled counts are `supervised`:
 * - `em`: Baum–Welch with the labelled counts kept — each iteration computes expected counts on
 *   the unlabelled text and re-estimates from labelled + weight × expected counts (Nigam et al.
 *   2000, "Text classification from labeled and unlabeled documents using EM", Machine Learning
 *   39, §5.2 weights the unlabelled data the same way);
 * - `sample`: stochastic EM (Celeux & Diebolt 1985) — each iteration draws one state sequence per
 *   sentence by forward filtering, backward sampling and re-estimates from labelled + weight ×
 *   those integer counts.
 * With add-λ estimates only (no position buckets, no previous-word or trigram tables) each EM
 * update is a MAP step, so W·log P(unlabelled) + Σ (labelled count + λ)·log θ never decreases;
 * the interpolated variants carry no such guarantee. Second-order models are not supported.
 */
export function refineWithUnlabelled(
  model: TaggerModel,
  supervised: SufficientStatistics,
  unlabelled: readonly (readonly (readonly string[])[])[],
  options: RefineOptions,
): { model: TaggerModel; history: IterationReport[] } {
  if (model.config.order !== 1) throw new RangeError("EM and sampling are implemented for first-order models (order 1)");
  if (model.nltk !== null) throw new RangeError("the NLTK-compatible configuration is supervised only");
  const history: IterationReport[] = [];
  let current = model;
  let unlabelledSentences = 0;
  let unlabelledTokens = 0;
  for (const doc of unlabelled) for (const s of doc) if (s.length > 0) {
    unlabelledSentences++;
    unlabelledTokens += s.length;
  }
  for (let n = 0; n < options.iterations; n++) {
    const started = options.now?.();
    const counts = createSufficientStatistics({
      states: supervised.states,
      symbols: supervised.symbols,
      buckets: supervised.buckets,
      sentenceBuckets: supervised.sentenceBuckets,
      prevWord: supervised.prevWord !== null,
      trigrams: supervised.trigrams !== null,
      contextEmissions: supervised.contextEmissions !== null,
    });
    let logLikelihood = 0;
    for (const doc of unlabelled) {
      doc.forEach((words, s) => {
        if (words.length > 0) logLikelihood += countUnlabelledSentence(current, words, s, counts, options.method, options.rng);
      });
    }
    current = assembleModel({
      config: current.config,
      scheme: current.scheme,
      tags: current.tags,
      vocabulary: current.vocabulary,
      statistics: addStatistics(supervised, counts, options.weight),
      suffix: current.suffix,
      clusters: current.clusters,
      corrections: current.corrections,
      summary: { ...current.summary, unlabelledDocuments: unlabelled.length, unlabelledSentences, unlabelledTokens },
    });
    const size = statisticsSize(counts, options.method === "em" ? "dense" : "sparse");
    const finished = options.now?.();
    const report: IterationReport = {
      iteration: n + 1,
      method: options.method,
      logLikelihood,
      seconds: started === undefined || finished === undefined ? null : (finished - started) / 1000,
      statisticsCells: size.cells,
      statisticsBytes: size.bytes,
    };
    history.push(report);
    options.onIteration?.(report);
  }
  return { model: current, history };
}
