import { decodeSentence, sentencePosteriors } from "./decode";
import type { TaggerModel } from "./tagger-model";

/** Uncertainty of a document under a model, for choosing what to annotate next. */
export type DocumentUncertainty = {
  /** Mean over tokens of the entropy of the posterior marginals, in nats. */
  readonly meanEntropy: number;
  /** Mean over sentences of 1 − P(best tag sequence | words). */
  readonly leastConfidence: number;
  readonly tokens: number;
};

/**
 * Token entropy (Settles & Craven 2008, "An analysis of active learning strategies for sequence
 * labeling tasks", EMNLP, token entropy averaged over the sequence) and least confidence
 * (Culotta & McCallum 2005, "Reducing labeling effort for structured prediction tasks", AAAI:
 * 1 − P(y* | x) with y* the Viterbi sequence), averaged over the document. Deterministic; empty
 * sentences are skipped; a document without tokens scores 0.
 */
export function documentUncertainty(model: TaggerModel, sentences: readonly (readonly string[])[]): DocumentUncertainty {
  const K = model.tags.length;
  let entropySum = 0;
  let tokens = 0;
  let confidenceSum = 0;
  let counted = 0;
  sentences.forEach((words, s) => {
    if (words.length === 0) return;
    const { posteriors, logLikelihood } = sentencePosteriors(model, words, s);
    for (let t = 0; t < words.length; t++) {
      let h = 0;
      for (let k = 0; k < K; k++) {
        const p = posteriors[t * K + k];
        if (p > 0) h -= p * Math.log(p);
      }
      entropySum += h;
    }
    tokens += words.length;
    const { logProbability } = decodeSentence(model, words, s);
    confidenceSum += 1 - Math.min(1, Math.exp(logProbability - logLikelihood));
    counted++;
  });
  return { meanEntropy: tokens === 0 ? 0 : entropySum / tokens, leastConfidence: counted === 0 ? 0 : confidenceSum / counted, tokens };
}
