import type { TaggerModel } from "../model/tagger-model";
import { clusterOf } from "./brown-clusters";
import { addClusterLogRatio } from "./cluster-emissions";
import { addFeatureWeights } from "./word-type-features";
import { addNeighbourWeights } from "./neighbour-features";

/**
 * What a model adds to the count-based emission row of one word (row[offset..offset+K)), after
 * the suffix ratio: the word-cluster ratio for unknown and rare words (cluster-emissions.ts), the
 * perceptron's emission weights of its symbol (perceptron.ts) and the summed weights of the word
 * type's features (word-type-features.ts). Nothing for a model with none of them, so such a model
 * scores exactly as before.
 */
export function addEmissionAdjustments(model: TaggerModel, word: string, firstInSentence: boolean, symbol: number, row: Float64Array, offset: number): void {
  addClusterLogRatio(model.clusters, model.vocabulary, word, firstInSentence, symbol, row, offset);
  const corrections = model.corrections;
  if (corrections !== null) {
    const K = model.tags.length;
    for (let k = 0; k < K; k++) row[offset + k] += corrections[symbol * K + k];
  }
  if (model.features !== null) addFeatureWeights(model.features, model.clusters?.clusters ?? null, word, firstInSentence, symbol < model.vocabulary.words.length, row, offset);
}

/**
 * True when {@link addEmissionAdjustments} may add something to a word's row that other words of
 * the same symbol (and suffix) do not get: a clustered unknown or rare word, or any word of a
 * model with word-type feature weights. Such a word's emission row cannot be shared.
 */
export function emissionRowIsOwn(model: TaggerModel, word: string, symbol: number): boolean {
  if (model.features !== null) return true;
  return model.clusters !== null && symbol >= model.vocabulary.words.length && clusterOf(model.clusters.clusters, word) >= 0;
}

/**
 * What a model adds per token of a sentence, after every token's word row (addEmissionAdjustments)
 * is in place: the weights of the neighbouring words' features (neighbour-features.ts), which
 * differ from token to token of one word type and so stay out of the per-word-type rows. `logRows`
 * is the sentence's T×K log emission lattice; `expRows`, when given, its exp, kept in step.
 * Nothing for a model without neighbour features.
 */
export function addTokenAdjustments(model: TaggerModel, words: readonly string[], logRows: Float64Array, expRows: Float64Array | null): void {
  if (model.neighbourFeatures !== null) addNeighbourWeights(model.neighbourFeatures, words, logRows, expRows);
}
