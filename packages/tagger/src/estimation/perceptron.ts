/**
 * Discriminative corrections of the count model's emission scores by the averaged perceptron of
 * Collins (2002), "Discriminative training methods for hidden Markov models: theory and
 * experiments with perceptron algorithms", EMNLP, §2.1–2.5: decode each training sentence with the
 * current scores; where the best path differs from the gold one, add the gold path's features and
 * subtract the predicted path's; after T passes, use the average of the weights over all
 * sentences (§2.5, the averaged variant that Collins found better than the last weights).
 *
 * The score of a path stays the count model's log-score; the perceptron adds a weight per
 * (symbol, tag) to the emission score, starting from 0, so the count model is the starting point
 * (Collins starts from zero weights; starting from the generative scores and learning corrections
 * is common practice). Only emissions get weights: they enter every decoder as an additive term of
 * the per-word emission row (see addEmissionAdjustments), while transition scores pass through the
 * previous-word interpolation, so an added weight would not act linearly. Updates are scaled by a
 * step `rate` (a fixed step does not change the perceptron's mistakes when weights start at 0,
 * but here it sets the size of a correction against the log-probabilities).
 */
import { toIob2 } from "../text/bio";
import type { ColumnDocument } from "../text/conll";
import { buildFirstOrderProblem } from "../model/decode-input";
import type { TaggerModel } from "../model/tagger-model";
import { planFolds } from "../evaluation/folds";
import { buildSecondOrderLattice } from "../model/decode-input";
import { decodeViterbi } from "../kernels/viterbi";
import { decodeViterbiSecondOrder } from "../kernels/viterbi-second-order";
import type { SecondOrderLattice } from "../kernels/second-order-lattice";
import type { EmissionInput, HmmParams } from "../kernels/hmm-params";
import { encodeWords, symbolOf } from "./vocabulary";
import { createFeatureWeights, featureKey, wordTypeFeatures, type FeatureWeights } from "./word-type-features";
import { neighbourFeatures } from "./neighbour-features";

/**
 * Step of each perceptron update, in log-score units. Under 5-fold CV on wikigold train+dev no
 * step beat the count model (F1 0.5508): 5 passes gave 0.5477, 0.5458, 0.5479 and 0.5415 at
 * steps 0.01, 0.03, 0.1 and 0.3 (bench/perceptron.ts), so the option stays off by default.
 */
export const PERCEPTRON_RATE = 0.1;

/** Folds of the jackknife that scores each training sentence with a model that did not count it. */
const JACKKNIFE_FOLDS = 5;


/**
 * Step of each update with the word-type features (word-type-features.ts), which put about a dozen
 * features on each token. 5-fold CV F1 on wikigold train+dev after 1 pass (count model 0.5508):
 * 0.5535, 0.5510 and 0.5493 at steps 0.005, 0.02 and 0.05; 3 passes 0.5523, 0.5488, 0.5497
 * (bench/features.ts has the table on the informal proxies too).
 */
export const WORD_TYPE_RATE = 0.005;

/**
 * Step of each update with the word-type and neighbour features (neighbour-features.ts), about
 * two dozen features per token: the best 5-fold CV F1 of steps 0.002, 0.005, 0.02, 0.05, 0.1, 0.2
 * and 0.5 at 1–3 passes on wikigold train+dev and on its lower-cased and noisy proxies was at 0.2
 * (3 passes on the proxies, 2 and 3 passes within 0.0001 on wikigold; bench/features.ts
 * neighbours, the table in the README).
 */
export const NEIGHBOUR_RATE = 0.2;

/** Features of each token of a sentence: token t's feature ids are ids[offsets[t]..offsets[t+1]). */
type TokenFeatures = { readonly offsets: Int32Array; readonly ids: Int32Array };

type Item = {
  /** First-order problem (order 1) or candidate lattice (order 2) of the jackknifed scorer. */
  readonly params: HmmParams | null;
  readonly input: EmissionInput | null;
  readonly lattice: SecondOrderLattice | null;
  /** The scorer's emission scores (T×K' for order 1, per candidate for order 2). */
  readonly base: Float64Array;
  readonly features: TokenFeatures;
  /** Gold tags as the scorer's states (−1: a tag the scorer lacks). */
  readonly gold: Int32Array;
  /** The scorer's states as the model's tags (−1: none). */
  readonly states: Int32Array;
  readonly K: number;
};

/**
 * The averaged perceptron over F features per token (Collins 2002 §2.1–2.5) on top of jackknifed
 * count-model scores; returns the F×K averaged weights. A token's emission score for tag k is the
 * scorer's plus Σ_f w[f·K + k] over the token's features (the sum formed first, from 0). A mistake
 * at token t (predicted tag p, gold tag g) adds `rate` to w[f·K + g] and subtracts it from
 * w[f·K + p] for each of t's features.
 */
function averagedPerceptron(
  model: TaggerModel,
  documents: readonly ColumnDocument[],
  epochs: number,
  trainCounts: (documents: readonly ColumnDocument[]) => TaggerModel,
  /** Number of features, asked once every sentence's features are known. */
  F: () => number,
  /** Features of a sentence's tokens, given the model that scores the sentence. */
  featuresOf: (words: readonly string[], scorer: TaggerModel, sentence: number) => TokenFeatures,
  rate: number,
  onStep?: (weights: Float64Array) => void,
  /** Called with the averaged weights after each pass but the last (number of passes done). */
  onPass?: (averaged: Float64Array, passes: number) => void,
): Float64Array {
  const K = model.tags.length;
  const secondOrder = model.config.order === 2;
  const tagIndex = new Map(model.tags.map((t, k) => [t, k]));
  // The average of w₀ = 0, w₁, …, w_n (the weights before the first and after each of the n
  // sentence visits) without summing them: Σ_j w_j = (n + 1)·w − Σ_updates c_u·δ_u, c_u the
  // number of the visit that made update δ_u (the "lazy" average, common practice).
  const items: Item[] = [];
  const nonEmpty = documents.reduce((n, d) => n + d.sentences.filter((s) => s.words.length > 0).length, 0);
  const folds = nonEmpty >= 2 * JACKKNIFE_FOLDS ? planFolds(documents, JACKKNIFE_FOLDS).folds : [documents.slice()];
  folds.forEach((heldOut, f) => {
    const others = folds.filter((_, g) => g !== f).flat();
    const scorer = folds.length === 1 ? model : trainCounts(others);
    // Fold states → the model's tags (a fold may lack a rare tag); the model's tags → fold states.
    const states = Int32Array.from(scorer.tags, (t) => tagIndex.get(t) ?? -1);
    const foldIndex = new Map(scorer.tags.map((t, k) => [t, k]));
    for (const doc of heldOut) {
      doc.sentences.forEach((s, index) => {
        if (s.words.length === 0) return;
        const tags = model.scheme === "iob" ? toIob2(s.tags) : s.tags;
        const gold = Int32Array.from(tags, (tag) => foldIndex.get(tag) ?? -1);
        const features = featuresOf(s.words, scorer, index);
        if (secondOrder) {
          const { lattice } = buildSecondOrderLattice(scorer, s.words, index);
          items.push({ params: null, input: null, lattice, base: lattice.emissions.slice(), features, gold, states, K: scorer.tags.length });
        } else {
          const { params, input } = buildFirstOrderProblem(scorer, s.words, index);
          items.push({ params, input, lattice: null, base: input.scores.slice(), features, gold, states, K: scorer.tags.length });
        }
      });
    }
  });
  const weights = new Float64Array(F() * K);
  const stamped = new Float64Array(weights.length);
  const sum = new Float64Array(K);
  // Σ_f w[f·K + k] over token t's features, for every tag k of the model, into `sum`.
  const sumRow = (features: TokenFeatures, t: number) => {
    sum.fill(0);
    for (let x = features.offsets[t]; x < features.offsets[t + 1]; x++) {
      const row = features.ids[x] * K;
      for (let k = 0; k < K; k++) sum[k] += weights[row + k];
    }
  };
  let c = 1;
  for (let epoch = 0; epoch < epochs; epoch++) {
    for (const item of items) {
      const { base, features, gold, states } = item;
      const k1 = item.K;
      let path: Int32Array;
      if (item.lattice !== null) {
        const { offsets, candidates, emissions } = item.lattice;
        for (let t = 0; t < item.lattice.length; t++) {
          sumRow(features, t);
          for (let i = offsets[t]; i < offsets[t + 1]; i++) emissions[i] = base[i] + (states[candidates[i]] < 0 ? 0 : sum[states[candidates[i]]]);
        }
        path = decodeViterbiSecondOrder(item.lattice).path;
      } else {
        const scores = item.input!.scores;
        for (let t = 0; t < gold.length; t++) {
          sumRow(features, t);
          for (let k = 0; k < k1; k++) scores[t * k1 + k] = base[t * k1 + k] + (states[k] < 0 ? 0 : sum[states[k]]);
        }
        path = decodeViterbi(item.params!, item.input!).path;
      }
      for (let t = 0; t < path.length; t++) {
        if (path[t] === gold[t] || gold[t] < 0 || states[path[t]] < 0) continue;
        const good = states[gold[t]];
        const bad = states[path[t]];
        for (let x = features.offsets[t]; x < features.offsets[t + 1]; x++) {
          const row = features.ids[x] * K;
          weights[row + good] += rate;
          weights[row + bad] -= rate;
          stamped[row + good] += c * rate;
          stamped[row + bad] -= c * rate;
        }
      }
      c++;
      onStep?.(weights);
    }
    if (onPass !== undefined && epoch < epochs - 1) onPass(averageOf(weights, stamped, c), epoch + 1);
  }
  return averageOf(weights, stamped, c);
}

/** The lazy average after c − 1 sentence visits: w − Σ_u c_u·δ_u / c (see averagedPerceptron). */
function averageOf(weights: Float64Array, stamped: Float64Array, c: number): Float64Array {
  const averaged = new Float64Array(weights.length);
  for (let x = 0; x < weights.length; x++) averaged[x] = weights[x] - stamped[x] / c;
  return averaged;
}

/**
 * S×K emission weights (symbols of `model`, the count model of all the documents) from `epochs`
 * passes of the averaged perceptron over the labelled documents, one feature per token: its
 * symbol. The count model has seen every training sentence, so it makes on them few of the
 * mistakes it makes on new text; each sentence is therefore scored by a count model trained on
 * the other JACKKNIFE_FOLDS − 1 folds (`trainCounts`, same configuration without the perceptron),
 * plus the weights of its tokens' symbols in `model` (jackknifing the base scores is common
 * practice for stacked learners, e.g. Wolpert 1992, "Stacked generalization", Neural Networks 5).
 * Deterministic: sentences in document order. Order-1 models only. Tags are read as the model
 * reads them (IOB2 for the iob scheme).
 */
export function trainEmissionCorrections(
  model: TaggerModel,
  documents: readonly ColumnDocument[],
  epochs: number,
  trainCounts: (documents: readonly ColumnDocument[]) => TaggerModel,
  rate = PERCEPTRON_RATE,
  /** Called with the weights after each sentence (tests check the average with it). */
  onStep?: (weights: Float64Array) => void,
): Float64Array {
  if (model.config.order !== 1) throw new RangeError("perceptron: order-1 models only");
  const featuresOf = (words: readonly string[]): TokenFeatures => ({ offsets: Int32Array.from({ length: words.length + 1 }, (_, t) => t), ids: encodeWords(model.vocabulary, words) });
  return averagedPerceptron(model, documents, epochs, trainCounts, () => model.statistics.symbols, featuresOf, rate, onStep);
}

/**
 * Weights of the word-type features (word-type-features.ts) from `epochs` passes of the averaged
 * perceptron, with the jackknifed base scores of {@link trainEmissionCorrections}; first- and
 * second-order models (the second decodes its candidate lattice, whose candidates stay those of
 * the count scores). Features are interned in order of first appearance in the documents; only
 * those with a non-zero averaged weight are kept. `onStep` gets the weights of every interned
 * feature after each sentence, with the interned names.
 */
export function trainWordTypeWeights(
  model: TaggerModel,
  documents: readonly ColumnDocument[],
  epochs: number,
  trainCounts: (documents: readonly ColumnDocument[]) => TaggerModel,
  rate = WORD_TYPE_RATE,
  onStep?: (weights: Float64Array, names: readonly string[]) => void,
): FeatureWeights {
  return trainFeatureTables(model, documents, epochs, trainCounts, { rate, onStep }, false).wordType;
}

/** Options of {@link trainNeighbourWeights}. */
export type NeighbourTrainingOptions = {
  /** Step of each update (default NEIGHBOUR_RATE). */
  readonly rate?: number;
  /** Called with the weights of every interned feature after each sentence, with the interned names. */
  readonly onStep?: (weights: Float64Array, names: readonly string[]) => void;
  /**
   * Called after each pass but the last with the tables the training would return had it
   * stopped there (the same numbers: the averages depend only on the passes before), so one run
   * of N passes also yields the 1, …, N − 1 pass results.
   */
  readonly onPass?: (tables: { wordType: FeatureWeights; neighbours: FeatureWeights }, passes: number) => void;
};

/**
 * The word-type features plus the features of the neighbouring words (neighbour-features.ts),
 * trained together as in {@link trainWordTypeWeights}: one perceptron whose token scores add both
 * kinds' weights. Returned as two tables: the word-type weights (cached per word type on the
 * tagging path) and the neighbour weights (added per token).
 */
export function trainNeighbourWeights(
  model: TaggerModel,
  documents: readonly ColumnDocument[],
  epochs: number,
  trainCounts: (documents: readonly ColumnDocument[]) => TaggerModel,
  options: NeighbourTrainingOptions = {},
): { wordType: FeatureWeights; neighbours: FeatureWeights } {
  const onPass = options.onPass;
  const tables = trainFeatureTables(
    model,
    documents,
    epochs,
    trainCounts,
    { rate: options.rate ?? NEIGHBOUR_RATE, onStep: options.onStep, onPass: onPass && ((t, passes) => onPass({ wordType: t.wordType, neighbours: t.neighbours! }, passes)) },
    true,
  );
  return { wordType: tables.wordType, neighbours: tables.neighbours! };
}

type FeatureTables = { wordType: FeatureWeights; neighbours: FeatureWeights | null };

function trainFeatureTables(
  model: TaggerModel,
  documents: readonly ColumnDocument[],
  epochs: number,
  trainCounts: (documents: readonly ColumnDocument[]) => TaggerModel,
  options: { rate: number; onStep?: (weights: Float64Array, names: readonly string[]) => void; onPass?: (tables: FeatureTables, passes: number) => void },
  withNeighbours: boolean,
): FeatureTables {
  const { rate, onStep, onPass } = options;
  const K = model.tags.length;
  const clusters = model.clusters?.clusters ?? null;
  const index = new Map<string, number>();
  const names: string[] = [];
  // Word-type names start "known:" or "class:" (featureKey), neighbour names "w", "class±1=" or
  // "shape±1=", so one index holds both kinds without a collision.
  const isNeighbour: boolean[] = [];
  const intern = (name: string, neighbour: boolean): number => {
    let f = index.get(name);
    if (f === undefined) {
      f = names.length;
      index.set(name, f);
      names.push(name);
      isNeighbour.push(neighbour);
    }
    return f;
  };
  const featuresOf = (words: readonly string[], scorer: TaggerModel): TokenFeatures => {
    const offsets = new Int32Array(words.length + 1);
    const ids: number[] = [];
    const V = scorer.vocabulary.words.length;
    words.forEach((word, t) => {
      const known = symbolOf(scorer.vocabulary, word, t === 0) < V;
      for (const feature of wordTypeFeatures(word, t === 0, clusters)) ids.push(intern(featureKey(feature, known), false));
      if (withNeighbours) for (const feature of neighbourFeatures(words, t)) ids.push(intern(feature, true));
      offsets[t + 1] = ids.length;
    });
    return { offsets, ids: Int32Array.from(ids) };
  };
  // Features are interned while the sentences are scored, before the weights are made (F()).
  const averaged = averagedPerceptron(
    model,
    documents,
    epochs,
    trainCounts,
    () => names.length,
    featuresOf,
    rate,
    onStep && ((w) => onStep(w, names)),
    onPass && ((a, passes) => onPass(tablesOf(a), passes)),
  );
  return tablesOf(averaged);

  function tablesOf(averaged: Float64Array): FeatureTables {
    return { wordType: tableOf(averaged, false), neighbours: withNeighbours ? tableOf(averaged, true) : null };
  }
  function tableOf(averaged: Float64Array, neighbour: boolean): FeatureWeights {
    const kept: number[] = [];
    for (let f = 0; f < names.length; f++) {
      if (isNeighbour[f] !== neighbour) continue;
      for (let k = 0; k < K; k++) {
        if (averaged[f * K + k] !== 0) {
          kept.push(f);
          break;
        }
      }
    }
    const weights = new Float64Array(kept.length * K);
    kept.forEach((f, g) => weights.set(averaged.subarray(f * K, f * K + K), g * K));
    return createFeatureWeights(kept.map((f) => names[f]), weights, K);
  }
}
