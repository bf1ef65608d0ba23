/**
 * Span-confidence calibration on wikigold: expected calibration error (10 equal-width bins) of
 * the default model's span confidences on test (trained on train+dev) and pooled over 5-fold CV
 * over the train+dev articles, the test reliability diagram (per bin: spans, mean confidence,
 * accuracy) and a bootstrap interval of the test ECE (2,000 resamples of the test spans, seed 1;
 * Efron & Tibshirani 1993, An Introduction to the Bootstrap, ch. 13 percentile interval).
 *
 * The test set holds 622 predicted spans: even confidences that are exactly calibrated give a
 * 10-bin ECE of about 0.04 on that many spans (outcomes drawn from the confidences themselves),
 * so single test figures near 0.05 are within sampling noise; the method is chosen by CV only.
 */
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { evaluateModel } from "../src/evaluation/evaluation";
import { planFolds } from "../src/evaluation/cross-validation";
import { expectedCalibrationError, type CalibrationBin } from "../src/metrics/calibration";
import { createRng } from "../src/util/random";
import { trainTagger } from "../src/model/tagger";
import type { TrainingConfig } from "../src/estimation/training-config";
import { parseColumnText } from "../src/text/conll";
import { wikigoldTrainDevArticles } from "./wikigold";

export type CalibrationRow = {
  test: number;
  testSpans: number;
  /** 95% percentile bootstrap interval of the test ECE. */
  testInterval: [number, number];
  testBins: CalibrationBin[];
  cv: number;
  cvSpans: number;
};

function bootstrapInterval(spans: readonly { confidence: number; correct: boolean }[], resamples = 2000): [number, number] {
  const rng = createRng(1);
  const values: number[] = [];
  const p = new Float64Array(spans.length);
  const y = new Array<boolean>(spans.length);
  for (let r = 0; r < resamples; r++) {
    for (let i = 0; i < spans.length; i++) {
      const s = spans[rng.nextInt(spans.length)];
      p[i] = s.confidence;
      y[i] = s.correct;
    }
    values.push(expectedCalibrationError(p, y).ece);
  }
  values.sort((a, b) => a - b);
  return [values[Math.floor(0.025 * resamples)], values[Math.ceil(0.975 * resamples) - 1]];
}

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
  return {
    test: onTest.calibration!.ece,
    testSpans: onTest.calibration!.count,
    testInterval: bootstrapInterval(onTest.spans!),
    testBins: onTest.calibration!.bins,
    cv: cv.ece,
    cvSpans: cv.count,
  };
}
