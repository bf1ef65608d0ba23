import type { TaggerModel } from "../model/tagger-model";
import { addClusterLogRatio } from "./cluster-emissions";

/**
 * What a model adds to the count-based emission row of one word (row[offset..offset+K)), after
 * the suffix ratio: the word-cluster ratio for unknown and rare words (cluster-emissions.ts) and
 * the perceptron's emission weights of its symbol (perceptron.ts). Nothing for a model with
 * neither, so such a model scores exactly as before.
 */
export function addEmissionAdjustments(model: TaggerModel, word: string, firstInSentence: boolean, symbol: number, row: Float64Array, offset: number): void {
  addClusterLogRatio(model.clusters, model.vocabulary, word, firstInSentence, symbol, row, offset);
  const corrections = model.corrections;
  if (corrections === null) return;
  const K = model.tags.length;
  for (let k = 0; k < K; k++) row[offset + k] += corrections[symbol * K + k];
}
