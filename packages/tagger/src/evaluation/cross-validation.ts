import type { ColumnDocument } from "../text/conll";
import { evaluateModel } from "./evaluation";
import { expectedCalibrationError } from "../metrics/calibration";
import { trainTagger } from "../model/tagger";
import type { TrainingConfig } from "../estimation/training-config";

import { planFolds, type FoldUnit } from "./folds";

export { planFolds, type FoldUnit };


/** Scores of one fold; entity figures are null for plain tags. */
export type FoldScore = { f1: number | null; precision: number | null; recall: number | null; tokenAccuracy: number; tokens: number };

/** Mean and sample standard deviation over folds. */
export type Spread = { mean: number; std: number };

export type CrossValidationResult = {
  readonly folds: FoldScore[];
  readonly unit: FoldUnit;
  readonly f1: Spread | null;
  readonly precision: Spread | null;
  readonly recall: Spread | null;
  readonly tokenAccuracy: Spread;
  /**
   * With `confidences` (iob scheme): expected calibration error (10 equal-width bins) of the
   * span confidences of every fold's held-out documents pooled, and the number of spans; else null.
   */
  readonly spanCalibrationError: { readonly ece: number; readonly spans: number } | null;
};

function spread(values: number[]): Spread {
  const mean = values.reduce((a, b) => a + b, 0) / values.length;
  const variance = values.length > 1 ? values.reduce((a, v) => a + (v - mean) ** 2, 0) / (values.length - 1) : 0;
  return { mean, std: Math.sqrt(variance) };
}

/**
 * k-fold cross-validation over documents: train on k−1 folds, score the held-out fold, report
 * each fold and the mean and standard deviation (model selection without a small dev set, whose
 * few hundred entities make F1 swing by several points). Semi-supervised settings need unlabelled
 * text, so folds are trained supervised.
 */
export function crossValidate(
  documents: readonly ColumnDocument[],
  config: Partial<TrainingConfig>,
  k: number,
  options: { confidences?: boolean } = {},
): CrossValidationResult {
  const { unit, folds } = planFolds(documents, k);
  const confidences: number[] = [];
  const correct: boolean[] = [];
  let withSpans = options.confidences === true;
  const scores = folds.map((heldOut, f) => {
    const training = folds.filter((_, g) => g !== f).flat();
    const { model } = trainTagger(training, config);
    const result = evaluateModel(model, heldOut, { confidences: options.confidences === true });
    if (result.spans === null) withSpans = false;
    else for (const span of result.spans) {
      confidences.push(span.confidence);
      correct.push(span.correct);
    }
    const e = result.entities;
    return {
      f1: e === null ? null : e.overall.f1,
      precision: e === null ? null : e.overall.precision,
      recall: e === null ? null : e.overall.recall,
      tokenAccuracy: result.tokenAccuracy,
      tokens: result.tokens,
    };
  });
  const entity = scores.every((s) => s.f1 !== null);
  return {
    folds: scores,
    unit,
    f1: entity ? spread(scores.map((s) => s.f1!)) : null,
    precision: entity ? spread(scores.map((s) => s.precision!)) : null,
    recall: entity ? spread(scores.map((s) => s.recall!)) : null,
    tokenAccuracy: spread(scores.map((s) => s.tokenAccuracy)),
    spanCalibrationError: withSpans ? { ece: expectedCalibrationError(confidences, correct).ece, spans: confidences.length } : null,
  };
}
