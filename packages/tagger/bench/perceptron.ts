/**
 * The averaged-perceptron option (src/estimation/perceptron.ts) against the count model: 5-fold
 * CV F1 over the 116 wikigold train+dev articles (see bench/wikigold.ts) and test F1, for a few
 * steps and numbers of passes (`tsx bench/perceptron.ts`). Calibration is off: it does not change
 * tags or F1.
 */
import { existsSync, readFileSync } from "node:fs";
import { join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { parseColumnText, type ColumnDocument } from "../src/text/conll";
import { planFolds } from "../src/evaluation/folds";
import { evaluateModel } from "../src/evaluation/evaluation";
import { trainTagger } from "../src/model/tagger";
import { trainEmissionCorrections } from "../src/estimation/perceptron";
import { wikigoldTrainDevArticles } from "./wikigold";

const counts = (docs: readonly ColumnDocument[]) => trainTagger(docs, { calibration: "none" }).model;

function f1(train: ColumnDocument[], test: ColumnDocument[], passes: number, rate: number): number {
  const counted = counts(train);
  const model = passes === 0 ? counted : { ...counted, corrections: trainEmissionCorrections(counted, train, passes, counts, rate) };
  return evaluateModel(model, test).entities!.overall.f1;
}

export function perceptronReport(directory: string, settings: Array<{ passes: number; rate: number }>): Array<{ passes: number; rate: number; cv: number; test: number }> {
  const read = (file: string) => parseColumnText(readFileSync(join(directory, file), "utf8"), { file }).documents;
  const plan = planFolds(wikigoldTrainDevArticles(directory), 5);
  const train = [...read("train.bio"), ...read("dev.bio")];
  const test = read("test.bio");
  return settings.map(({ passes, rate }) => {
    const scores = plan.folds.map((heldOut, f) => f1(plan.folds.filter((_, g) => g !== f).flat(), heldOut, passes, rate));
    return { passes, rate, cv: scores.reduce((a, b) => a + b, 0) / scores.length, test: f1(train, test, passes, rate) };
  });
}

if (process.argv[1] !== undefined && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const here = fileURLToPath(new URL(".", import.meta.url));
  const shared = process.env.TAGLOOM_SHARED ?? ["../../../../shared", "../../../../../shared"].map((r) => resolve(here, r)).find((d) => existsSync(join(d, "data", "wikigold")))!;
  const settings = [{ passes: 0, rate: 0 }, ...[0.01, 0.03, 0.1, 0.3].map((rate) => ({ passes: 5, rate })), { passes: 1, rate: 0.1 }, { passes: 10, rate: 0.1 }];
  for (const r of perceptronReport(join(shared, "data", "wikigold"), settings)) {
    process.stdout.write(`${r.passes === 0 ? "count model (no perceptron)".padEnd(34) : `${r.passes} passes, step ${r.rate}`.padEnd(34)} CV F1 ${r.cv.toFixed(4)}  test F1 ${r.test.toFixed(4)}\n`);
  }
}
