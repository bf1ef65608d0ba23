/**
 * Span-confidence calibration on wikigold: expected calibration error (10 equal-width bins) of
 * the default model's span confidences on test (trained on train+dev) and pooled over 5-fold CV
 * over the train+dev articles.
 */
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { evaluateModel } from "../src/evaluation/evaluation";
import { planFolds } from "../src/evaluation/cross-validation";
import { expectedCalibrationError } from "../src/metrics/calibration";
import { trainTagger } from "../src/model/tagger";
import type { TrainingConfig } from "../src/estimation/training-config";
import { parseColumnText } from "../src/text/conll";
import { wikigoldTrainDevArticles } from "./wikigold";

export type CalibrationRow = { test: number; testSpans: number; cv: number; cvSpans: number };

export function calibrationReport(directory: string, config: Partial<TrainingConfig> = {}, folds = 5): CalibrationRow {
  const articles = wikigoldTrainDevArticles(directory);
  const test = parseColumnText(readFileSync(join(directory, "test.bio"), "utf8"), { file: "test.bio" }).documents;
  const onTest = evaluateModel(trainTagger(articles, config).model, test, { confidences: true });
  const plan = planFolds(articles, folds);
  const pooled: { confidence: number; correct: boolean }[] = [];
  plan.folds.forEach((held, f) => {
    const train = plan.folds.filter((_, g) => g !== f).flat();
    pooled.push(...evaluateModel(trainTagger(train, config).model, held, { confidences: true }).spans!);
  });
  const cv = expectedCalibrationError(pooled.map((s) => s.confidence), pooled.map((s) => s.correct));
  return { test: onTest.calibration!.ece, testSpans: onTest.calibration!.count, cv: cv.ece, cvSpans: cv.count };
}
