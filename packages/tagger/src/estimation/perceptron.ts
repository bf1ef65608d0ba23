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
import { decodeViterbi } from "../kernels/viterbi";
import type { EmissionInput, HmmParams } from "../kernels/hmm-params";
import { encodeWords } from "./vocabulary";

/**
 * Step of each perceptron update, in log-score units. Under 5-fold CV on wikigold train+dev no
 * step beat the count model (F1 0.5508): 5 passes gave 0.5477, 0.5458, 0.5479 and 0.5415 at
 * steps 0.01, 0.03, 0.1 and 0.3 (bench/perceptron.ts), so the option stays off by default.
 */
export const PERCEPTRON_RATE = 0.1;

/** Folds of the jackknife that scores each training sentence with a model that did not count it. */
const JACKKNIFE_FOLDS = 5;

/**
 * S×K emission weights (symbols of `model`, the count model of all the documents) from `epochs`
 * passes of the averaged perceptron over the labelled documents. The count model has seen every
 * training sentence, so it makes on them few of the mistakes it makes on new text; each sentence
 * is therefore scored by a count model trained on the other JACKKNIFE_FOLDS − 1 folds
 * (`trainCounts`, same configuration without the perceptron), plus the weights of its tokens'
 * symbols in `model` (jackknifing the base scores is common practice for stacked learners, e.g.
 * Wolpert 1992, "Stacked generalization", Neural Networks 5). Deterministic: sentences in document
 * order. Order-1 models only. Tags are read as the model reads them (IOB2 for the iob scheme).
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
  const K = model.tags.length;
  const S = model.statistics.symbols;
  const tagIndex = new Map(model.tags.map((t, k) => [t, k]));
  const weights = new Float64Array(S * K);
  // The average of w₀ = 0, w₁, …, w_n (the weights before the first and after each of the n
  // sentence visits) without summing them: Σ_j w_j = (n + 1)·w − Σ_updates c_u·δ_u, c_u the
  // number of the visit that made update δ_u (the "lazy" average, common practice).
  const stamped = new Float64Array(S * K);
  type Item = { params: HmmParams; input: EmissionInput; base: Float64Array; symbols: Int32Array; gold: Int32Array; states: Int32Array; K: number };
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
        const { params, input } = buildFirstOrderProblem(scorer, s.words, index);
        items.push({
          params,
          input,
          base: input.scores.slice(),
          symbols: encodeWords(model.vocabulary, s.words),
          gold: Int32Array.from(tags, (tag) => foldIndex.get(tag) ?? -1),
          states,
          K: scorer.tags.length,
        });
      });
    }
  });
  let c = 1;
  for (let epoch = 0; epoch < epochs; epoch++) {
    for (const item of items) {
      const { params, input, base, symbols, gold, states } = item;
      const k1 = item.K;
      const scores = input.scores;
      for (let t = 0; t < symbols.length; t++) {
        for (let k = 0; k < k1; k++) scores[t * k1 + k] = base[t * k1 + k] + (states[k] < 0 ? 0 : weights[symbols[t] * K + states[k]]);
      }
      const { path } = decodeViterbi(params, input);
      for (let t = 0; t < path.length; t++) {
        if (path[t] === gold[t] || gold[t] < 0 || states[path[t]] < 0) continue;
        const good = symbols[t] * K + states[gold[t]];
        const bad = symbols[t] * K + states[path[t]];
        weights[good] += rate;
        weights[bad] -= rate;
        stamped[good] += c * rate;
        stamped[bad] -= c * rate;
      }
      c++;
      onStep?.(weights);
    }
  }
  const averaged = new Float64Array(S * K);
  for (let x = 0; x < S * K; x++) averaged[x] = weights[x] - stamped[x] / c;
  return averaged;
}
