import { decodeSentence, sentencePosteriors } from "./decode";
import { buildFirstOrderProblem } from "./decode-input";
import { computePosteriors } from "../kernels/forward-backward";
import { tagSentence } from "./tagger";
import type { TaggerModel } from "./tagger-model";

/** Uncertainty of a document under a model, for choosing what to annotate next (the product's ranking reads meanEntropy). */
export type DocumentUncertainty = {
  /** Mean over tokens of the entropy of the posterior marginals, in nats. */
  readonly meanEntropy: number;
  /** Mean over sentences of 1 − P(best tag sequence | words). */
  readonly leastConfidence: number;
  readonly tokens: number;
};

/** {@link DocumentUncertainty} and the other measures the active-learning bench compares. */
export type UncertaintyMeasures = DocumentUncertainty & {
  /** Sum over tokens of the entropy of the posterior marginals, in nats. */
  readonly totalEntropy: number;
  /** Sum over sentences of 1 − P(best tag sequence | words): the expected number of sentences whose best tagging is wrong somewhere. */
  readonly leastConfidenceSum: number;
  /**
   * Sum over sentences of the entropy of the whole tag sequence, H(Y | words), in nats; exact for
   * first-order models, null for second-order ones (their posterior is a chain over tag pairs).
   */
  readonly sequenceEntropy: number | null;
  /** Spans the model predicts (the Viterbi chunks), and their mean and largest 1 − confidence (0 without spans). */
  readonly spans: number;
  readonly spanUncertaintyMean: number;
  readonly spanUncertaintyMax: number;
  /**
   * Expected number of entities the predicted spans miss: Σ over tokens the best tagging leaves
   * outside every span of P(an entity begins there | words), i.e. Σ_X P(B-X at t).
   */
  readonly missedEntities: number;
  /** The largest single-token term of {@link missedEntities}: how likely the likeliest missed entity is. */
  readonly missedEntityMax: number;
  /**
   * Expected number of span errors of the suggestions: Σ over predicted spans of (1 − confidence),
   * the expected number of wrong spans, plus {@link missedEntities}.
   */
  readonly expectedSpanErrors: number;
  /** expectedSpanErrors per token (0 without tokens): the product's "Most uncertain" ranking key. */
  readonly spanErrorDensity: number;
};

const EMPTY: UncertaintyMeasures = {
  meanEntropy: 0,
  leastConfidence: 0,
  tokens: 0,
  totalEntropy: 0,
  leastConfidenceSum: 0,
  sequenceEntropy: 0,
  spans: 0,
  spanUncertaintyMean: 0,
  spanUncertaintyMax: 0,
  missedEntities: 0,
  missedEntityMax: 0,
  expectedSpanErrors: 0,
  spanErrorDensity: 0,
};

/** Which states begin an entity (B-X) in an IOB model; all false for plain tags. */
function beginStates(model: TaggerModel): boolean[] {
  return model.tags.map((t) => model.scheme === "iob" && t.startsWith("B-"));
}

/**
 * Entropy of the tag sequence of one sentence under a first-order model, H(Y | x). Given the
 * words the posterior over tag sequences is itself a Markov chain with P(y_1 = i) = γ_1(i) and
 * P(y_t = j | y_{t−1} = i) = ξ_t(i, j)/γ_{t−1}(i), so by the chain rule of entropy (Cover & Thomas,
 * "Elements of Information Theory", 2nd ed., §2.5 and §4.2)
 *   H(Y | x) = −Σ_i γ_1(i) ln γ_1(i) − Σ_{t≥2} Σ_{i,j} ξ_t(i, j) ln(ξ_t(i, j)/γ_{t−1}(i)),
 * the exact form of the sequence entropy that Settles & Craven (2008) approximate from N-best
 * lists (Hernando, Crespi & Cybenko 2005 compute the same quantity recursively). With log
 * forward α and backward β, ln(ξ_t(i, j)/γ_{t−1}(i)) = ln a_t(i, j) + ln e_t(j) + β_t(j) − β_{t−1}(i).
 */
function firstOrderSentence(model: TaggerModel, words: readonly string[], s: number): { posteriors: Float64Array; logLikelihood: number; sequenceEntropy: number } {
  const K = model.tags.length;
  const KK = K * K;
  const T = words.length;
  const { params, input } = buildFirstOrderProblem(model, words, s);
  const { posteriors, logLikelihood, alpha, beta } = computePosteriors(params, input);
  let h = 0;
  for (let i = 0; i < K; i++) {
    const p = posteriors[i];
    if (p > 0) h -= p * Math.log(p);
  }
  const scores = input.scores;
  const rows = input.rows;
  const index = input.transitionIndex;
  const logA = params.transitions;
  for (let t = 1; t < T; t++) {
    const e = (rows === null ? t : rows[t]) * K;
    const m = index === null ? 0 : index[t] * KK;
    for (let i = 0; i < K; i++) {
      const left = alpha[(t - 1) * K + i];
      if (left === -Infinity) continue;
      const back = beta[(t - 1) * K + i];
      for (let j = 0; j < K; j++) {
        const step = logA[m + i * K + j] + scores[e + j] + beta[t * K + j];
        if (step === -Infinity) continue;
        const xi = Math.exp(left + step - logLikelihood);
        if (xi > 0) h -= xi * (step - back);
      }
    }
  }
  // Rounding can leave a tiny negative value for a certain sentence.
  return { posteriors, logLikelihood, sequenceEntropy: Math.max(0, h) };
}

/**
 * Uncertainty measures of a document for active learning, after Settles & Craven (2008), "An
 * analysis of active learning strategies for sequence labeling tasks", EMNLP, §3.1: token entropy
 * averaged over tokens (meanEntropy) and summed (totalEntropy), least confidence of the Viterbi
 * sequence (Culotta & McCallum 2005, "Reducing labeling effort for structured prediction tasks",
 * AAAI: 1 − P(y* | x)), averaged and summed over sentences, and the sequence entropy; and, for
 * IOB models, measures on the predicted spans: 1 − the span's (calibrated) confidence, averaged
 * and at its largest, and the expected number of span errors, wrong spans plus missed entities
 * (expectedSpanErrors, and per token spanErrorDensity). Deterministic; empty sentences are
 * skipped; a document without tokens scores 0 everywhere. About twice the work of
 * {@link documentUncertainty}, which computes the first three fields alone.
 */
export function uncertaintyMeasures(model: TaggerModel, sentences: readonly (readonly string[])[]): UncertaintyMeasures {
  const K = model.tags.length;
  const begins = beginStates(model);
  const firstOrder = model.config.order === 1;
  let entropySum = 0;
  let tokens = 0;
  let confidenceSum = 0;
  let counted = 0;
  let sequenceEntropy = 0;
  let spans = 0;
  let spanSum = 0;
  let spanMax = 0;
  let missed = 0;
  let missedMax = 0;
  sentences.forEach((words, s) => {
    if (words.length === 0) return;
    const { posteriors, logLikelihood, sequenceEntropy: h } = firstOrder ? firstOrderSentence(model, words, s) : { ...sentencePosteriors(model, words, s), sequenceEntropy: 0 };
    for (let t = 0; t < words.length; t++) {
      let h = 0;
      for (let k = 0; k < K; k++) {
        const p = posteriors[t * K + k];
        if (p > 0) h -= p * Math.log(p);
      }
      entropySum += h;
    }
    sequenceEntropy += h;
    tokens += words.length;
    const { logProbability } = decodeSentence(model, words, s);
    confidenceSum += 1 - Math.min(1, Math.exp(logProbability - logLikelihood));
    counted++;
    if (model.scheme !== "iob") return;
    const { chunks } = tagSentence(model, words, { sentenceIndex: s });
    const inside = new Uint8Array(words.length);
    for (const c of chunks) {
      const u = 1 - c.confidence;
      spans++;
      spanSum += u;
      if (u > spanMax) spanMax = u;
      inside.fill(1, c.start, c.end);
    }
    for (let t = 0; t < words.length; t++) {
      if (inside[t] === 1) continue;
      let p = 0;
      for (let k = 0; k < K; k++) if (begins[k]) p += posteriors[t * K + k];
      missed += p;
      if (p > missedMax) missedMax = p;
    }
  });
  if (tokens === 0) return EMPTY;
  const expectedSpanErrors = spanSum + missed;
  return {
    meanEntropy: entropySum / tokens,
    leastConfidence: confidenceSum / counted,
    tokens,
    totalEntropy: entropySum,
    leastConfidenceSum: confidenceSum,
    sequenceEntropy: firstOrder ? sequenceEntropy : null,
    spans,
    spanUncertaintyMean: spans === 0 ? 0 : spanSum / spans,
    spanUncertaintyMax: spanMax,
    missedEntities: missed,
    missedEntityMax: missedMax,
    expectedSpanErrors,
    spanErrorDensity: expectedSpanErrors / tokens,
  };
}

/**
 * Token entropy averaged over the document and least confidence averaged over sentences, as in
 * {@link uncertaintyMeasures} (the same numbers) without the other measures: what the suggestion
 * job stores and the "Most uncertain" view ranks by (bench/active-learning.ts compares the rest).
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
