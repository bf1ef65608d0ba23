import type { SufficientStatistics } from "./sufficient-statistics";
import { DEFAULT_TRAINING_CONFIG, type TrainingConfig } from "./training-config";

/**
 * The configuration that reproduces NLTK's supervised HMM (nltk.tag.hmm, NLTK 3.8,
 * HiddenMarkovModelTrainer.train_supervised with estimator LidstoneProbDist(fd, γ, bins); read
 * from its source, nltk/tag/hmm.py, and checked live by test/nltk.test.ts): one state per
 * training tag, no position buckets, no word classes, no
 * suffixes, no end state, every training word known (an unknown word gets γ/(n(t)+γ·V)).
 */
export function nltkCompatibleConfig(gamma: number): TrainingConfig {
  return {
    ...DEFAULT_TRAINING_CONFIG,
    smoothing: { start: gamma, transition: gamma, emission: gamma },
    transitionPrior: [],
    constrainIob: false,
    endState: false,
    positionBuckets: { token: [], sentence: [] },
    rare: 0,
    lowercaseFirstWord: false,
    wordClasses: "none",
    suffixLength: 0,
    contextEmissions: false,
    order: 1,
    prevWord: false,
    semi: "none",
    nltkCompatible: true,
  };
}

/** NLTK's decoding tables: float32 log2 probabilities (start K, transitions K×K, emissions S×K). */
export type NltkTables = { readonly start: Float32Array; readonly transitions: Float32Array; readonly emissions: Float32Array };

/**
 * Builds the tables with NLTK's own arithmetic: p = (c + γ)/(N + bins·γ) in float64
 * (LidstoneProbDist.prob), log2 as math.log(p, 2) = ln p / ln 2 (ProbDistI.logprob), then float32
 * (the numpy arrays of HiddenMarkovModelTagger._create_cache). N counts: sentences for the start;
 * transitions out of the state, so sentence-final tokens are not in it; tokens of the state for
 * emissions. bins: K states for start and transitions, V training word types for emissions.
 */
export function buildNltkTables(stats: SufficientStatistics, gamma: number, wordTypes: number): NltkTables {
  const K = stats.states;
  const S = stats.symbols;
  const log2 = (p: number) => (p !== 0 ? Math.log(p) / Math.log(2) : -Infinity);
  const lidstone = (c: number, n: number, bins: number) => {
    let g = gamma;
    let divisor = n + bins * gamma;
    // LidstoneProbDist: a zero divisor forces probability 0.
    if (divisor === 0) {
      g = 0;
      divisor = 1;
    }
    return (c + g) / divisor;
  };
  const start = new Float32Array(K);
  let sentences = 0;
  for (let b = 0; b < stats.sentenceBuckets; b++) for (let k = 0; k < K; k++) sentences += stats.start[b * K + k];
  for (let k = 0; k < K; k++) {
    let c = 0;
    for (let b = 0; b < stats.sentenceBuckets; b++) c += stats.start[b * K + k];
    start[k] = log2(lidstone(c, sentences, K));
  }
  const transitions = new Float32Array(K * K);
  const KK = K * K;
  for (let i = 0; i < K; i++) {
    let n = 0;
    const row = new Float64Array(K);
    for (let b = 0; b < stats.buckets; b++) for (let j = 0; j < K; j++) row[j] += stats.transitions[b * KK + i * K + j];
    for (let j = 0; j < K; j++) n += row[j];
    for (let j = 0; j < K; j++) transitions[i * K + j] = log2(lidstone(row[j], n, K));
  }
  const emissions = new Float32Array(S * K);
  const totals = new Float64Array(K);
  for (let s = 0; s < S; s++) for (let k = 0; k < K; k++) totals[k] += stats.emissions[s * K + k];
  for (let s = 0; s < S; s++) for (let k = 0; k < K; k++) emissions[s * K + k] = log2(lidstone(stats.emissions[s * K + k], totals[k], wordTypes));
  return { start, transitions, emissions };
}
