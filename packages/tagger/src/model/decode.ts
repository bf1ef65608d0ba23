import { buildFirstOrderProblem, buildSecondOrderLattice } from "./decode-input";
import { computePosteriors } from "../kernels/forward-backward";
import { computePosteriorsSecondOrder } from "../kernels/forward-backward-second-order";
import { computeForward } from "../kernels/forward";
import { computeForwardSecondOrder } from "../kernels/forward-second-order";
import type { TaggerModel } from "./tagger-model";
import { decodeViterbi } from "../kernels/viterbi";
import { decodeViterbiFloat32 } from "../kernels/viterbi-float32";
import { decodeViterbiSecondOrder } from "../kernels/viterbi-second-order";
import { encodeWords } from "../estimation/vocabulary";

/** Best state sequence of a sentence and its joint log-probability (natural log). */
export function decodeSentence(model: TaggerModel, words: readonly string[], sentenceIndex = 0): { path: Int32Array; logProbability: number } {
  if (model.nltk !== null) return decodeNltk(model, words);
  if (model.config.order === 2) return decodeViterbiSecondOrder(buildSecondOrderLattice(model, words, sentenceIndex).lattice);
  const { params, input } = buildFirstOrderProblem(model, words, sentenceIndex);
  return decodeViterbi(params, input);
}

/** NLTK's decoder: float32 log2 tables and float32 lattice (see viterbi-float32.ts). */
function decodeNltk(model: TaggerModel, words: readonly string[]): { path: Int32Array; logProbability: number } {
  const tables = model.nltk!;
  const K = model.tags.length;
  const symbols = encodeWords(model.vocabulary, words);
  const rows = new Float32Array(words.length * K);
  for (let t = 0; t < words.length; t++) rows.set(tables.emissions.subarray(symbols[t] * K, symbols[t] * K + K), t * K);
  const path = decodeViterbiFloat32(K, tables.start, tables.transitions, rows, words.length);
  // Report the path's probability in natural log from the float64 parameters.
  const { params, input } = buildFirstOrderProblem(model, words, 0);
  let logProbability = 0;
  for (let t = 0; t < words.length; t++) {
    logProbability += input.scores[t * K + path[t]];
    logProbability += t === 0 ? params.start[path[0]] : params.transitions[path[t - 1] * K + path[t]];
  }
  return { path, logProbability };
}

/** Posterior marginals (T×K probabilities) and log P(words) of a sentence. */
export function sentencePosteriors(model: TaggerModel, words: readonly string[], sentenceIndex = 0): { posteriors: Float64Array; logLikelihood: number } {
  if (model.config.order === 2) return computePosteriorsSecondOrder(buildSecondOrderLattice(model, words, sentenceIndex).lattice);
  const { params, input } = buildFirstOrderProblem(model, words, sentenceIndex);
  const { posteriors, logLikelihood } = computePosteriors(params, input);
  return { posteriors, logLikelihood };
}

/** log P(words) of a sentence (forward algorithm). */
export function sentenceLogLikelihood(model: TaggerModel, words: readonly string[], sentenceIndex = 0): number {
  if (model.config.order === 2) return computeForwardSecondOrder(buildSecondOrderLattice(model, words, sentenceIndex).lattice).logLikelihood;
  const { params, input } = buildFirstOrderProblem(model, words, sentenceIndex);
  return computeForward(params, input).logLikelihood;
}
