import type { Evaluation, RunIteration } from "@tagloom/contracts";
import { type ColumnDocument, type CrossValidationResult, type Evaluation as EngineEvaluation, computeConfusionMatrix } from "@tagloom/tagger";

export type LearningCurvePoint = Evaluation["learningCurve"][number];

/** Entity scores of an engine evaluation in the contract's shape (types in the engine's sorted order). */
export function scoresOf(result: EngineEvaluation): Pick<Evaluation, "overall" | "types" | "tokenAccuracy" | "tokens" | "sentences"> {
  const e = result.entities;
  return {
    overall: e ? { ...e.overall } : { precision: 0, recall: 0, f1: 0, correct: 0, predicted: 0, gold: 0 },
    types: e
      ? Object.entries(e.types).map(([type, v]) => ({ type, precision: v.precision, recall: v.recall, f1: v.f1, support: v.support, correct: v.correct, predicted: v.predicted }))
      : [],
    tokenAccuracy: result.tokenAccuracy,
    tokens: result.tokens,
    sentences: result.sentences,
  };
}

/**
 * Token-level confusion between entity types, with the row of gold `O` read as "spurious" and
 * the column of predicted `O` as "missed" (computeConfusionMatrix strips B-/I-).
 */
export function confusionOf(test: readonly ColumnDocument[], result: EngineEvaluation): Evaluation["confusion"] {
  const gold = test.flatMap((d) => d.sentences.map((s) => s.tags));
  const predicted = result.predicted.flat();
  const m = computeConfusionMatrix(gold, predicted);
  const o = m.labels.indexOf("O");
  const typeIdx = m.labels.map((_, i) => i).filter((i) => i !== o);
  return {
    types: typeIdx.map((i) => m.labels[i]!),
    counts: typeIdx.map((g) => typeIdx.map((p) => m.counts[g]![p]!)),
    missed: typeIdx.map((g) => (o < 0 ? 0 : m.counts[g]![o]!)),
    spurious: typeIdx.map((p) => (o < 0 ? 0 : m.counts[o]![p]!)),
  };
}

export function crossValidationOf(cv: CrossValidationResult | null): Evaluation["crossValidation"] {
  if (cv === null || cv.f1 === null || cv.precision === null || cv.recall === null) return null;
  return {
    folds: cv.folds.length,
    unit: cv.unit,
    f1: cv.f1,
    precision: cv.precision,
    recall: cv.recall,
    tokenAccuracy: cv.tokenAccuracy,
    perFold: cv.folds.map((f) => ({ f1: f.f1 ?? 0, precision: f.precision ?? 0, recall: f.recall ?? 0, tokenAccuracy: f.tokenAccuracy, tokens: f.tokens })),
  };
}

export function buildEvaluation(parts: {
  test: readonly ColumnDocument[];
  result: EngineEvaluation;
  crossValidation: CrossValidationResult | null;
  learningCurve: LearningCurvePoint[];
  semi: { method: "em" | "sample"; iterations: RunIteration[] } | null;
}): Evaluation {
  return {
    ...scoresOf(parts.result),
    documents: parts.test.length,
    confusion: confusionOf(parts.test, parts.result),
    crossValidation: crossValidationOf(parts.crossValidation),
    learningCurve: parts.learningCurve,
    semiSupervised: parts.semi,
  };
}
