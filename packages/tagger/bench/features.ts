/**
 * The averaged perceptron over word-type features (src/estimation/word-type-features.ts,
 * `--perceptron N --perceptron-features word-type`) against the count model
 * (`tsx bench/features.ts [wikigold|brown]`):
 *  - wikigold and its two informal-text proxies (all lower case; noisy: handles, hashtags, URLs,
 *    lengthened words), built by bench/clusters.ts: 5-fold CV F1 over the 116 train+dev articles,
 *    test F1, and the test F1 difference from the count model with its 95% paired-bootstrap
 *    interval over the 29 test articles (metrics/bootstrap.ts);
 *  - Brown news POS (test/brown-corpus.ts): test token accuracy of the trigram model (what the
 *    CLI's selection picks there) with and without the features, and the difference with a 95%
 *    percentile bootstrap interval over the test documents (documents drawn with replacement,
 *    tokens pooled; Efron & Tibshirani 1993, "An Introduction to the Bootstrap", ch. 13).
 *  - `tsx bench/features.ts neighbours [word-type] [steps=S,...] [edited|lower|noisy ...]`: the
 *    perceptron over word-type plus neighbour features (estimation/neighbour-features.ts) at each
 *    step of NEIGHBOUR_STEPS (or the steps given; with `word-type`, the word-type perceptron at
 *    those steps instead, to tell the neighbours' share from the step's) and 1 to
 *    NEIGHBOUR_PASSES passes (one run of the most passes per step and fold: the averages after
 *    fewer passes are those of shorter runs), on the same texts and folds; besides the table's figures, the per-fold CV differences from the
 *    count model (mean ± std over the 5 folds, paired: the same folds);
 *  - `tsx bench/features.ts selection [variants ...]`: what the CLI's selection picks (its
 *    candidates, then the neighbour perceptron taken on a paired t-test of its per-fold gains),
 *    and the test F1 of its choice;
 *  - `tsx bench/features.ts brown-neighbours [passes]`: the Brown report with the neighbour
 *    perceptron instead of the word-type one.
 * Calibration is off: it does not change tags or F1.
 */
import { existsSync } from "node:fs";
import { join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { clusterReport, VARIANTS, variantTexts } from "./clusters";
import type { ColumnDocument } from "../src/text/conll";
import { evaluateModel } from "../src/evaluation/evaluation";
import { pairedBootstrap } from "../src/metrics/bootstrap";
import { trainNeighbourWeights, trainWordTypeWeights } from "../src/estimation/perceptron";
import type { TaggerModel } from "../src/model/tagger-model";
import { type SelectionResult, selectConfiguration } from "../src/estimation/select-config";
import { brownNewsSplit } from "../test/brown-corpus";
import { tagDocument, trainTagger } from "../src/model/tagger";
import { createRng } from "../src/util/random";
import type { TrainingConfig } from "../src/estimation/training-config";

export const FEATURE_CONFIGURATIONS: Array<{ name: string; config: Partial<TrainingConfig>; transductive: boolean }> = [
  { name: "count model (default)", config: {}, transductive: false },
  { name: "word-type perceptron, 1 pass", config: { perceptron: 1, perceptronFeatures: "word-type" }, transductive: false },
  { name: "word-type perceptron, 3 passes", config: { perceptron: 3, perceptronFeatures: "word-type" }, transductive: false },
  { name: "symbol perceptron, 5 passes", config: { perceptron: 5 }, transductive: false },
];

const TRIGRAM: Partial<TrainingConfig> = { order: 2, prevWord: false, contextEmissions: false, suffixTheta: 1, suffixLength: 10, calibration: "none" };

/**
 * Brown news test token accuracy, trigram with and without the perceptron options
 * `perceptron` (default 1 pass over word-type features); bootstrap over documents.
 */
export function brownFeatureReport(samples = 1000, perceptron: Partial<TrainingConfig> = { perceptron: 1, perceptronFeatures: "word-type" }): { base: number; features: number; delta: number; ci: [number, number]; seconds: [number, number] } {
  const { train, test } = brownNewsSplit();
  const correct = (config: Partial<TrainingConfig>) => {
    const started = process.hrtime.bigint();
    const { model } = trainTagger(train, config);
    const seconds = Number(process.hrtime.bigint() - started) / 1e9;
    const perDoc = test.map((d) => {
      const tags = tagDocument(model, d.sentences.map((s) => s.words));
      let right = 0;
      let all = 0;
      d.sentences.forEach((s, i) => s.tags.forEach((tag, t) => ((all += 1), (right += tags[i][t] === tag ? 1 : 0))));
      return [right, all] as const;
    });
    return { perDoc, seconds };
  };
  const a = correct(TRIGRAM);
  const b = correct({ ...TRIGRAM, ...perceptron });
  const accuracy = (rows: readonly (readonly [number, number])[], pick: readonly number[]) => pick.reduce((n, i) => n + rows[i][0], 0) / pick.reduce((n, i) => n + rows[i][1], 0);
  const all = test.map((_, i) => i);
  const rng = createRng(7);
  const deltas = Array.from({ length: samples }, () => {
    const pick = all.map(() => Math.floor(rng.next() * all.length));
    return accuracy(b.perDoc, pick) - accuracy(a.perDoc, pick);
  }).sort((x, y) => x - y);
  const q = (p: number) => deltas[Math.min(deltas.length - 1, Math.floor(p * deltas.length))];
  const base = accuracy(a.perDoc, all);
  const features = accuracy(b.perDoc, all);
  return { base, features, delta: features - base, ci: [q(0.025), q(0.975)], seconds: [a.seconds, b.seconds] };
}

/**
 * Steps and the most passes tried for the neighbour features by default (the README's grid adds
 * steps=0.05,0.1 and steps=0.2,0.5).
 */
export const NEIGHBOUR_STEPS = [0.002, 0.005, 0.02];
export const NEIGHBOUR_PASSES = 3;

export type NeighbourRow = {
  variant: string;
  name: string;
  cvMean: number;
  cvStd: number;
  /** Per-fold F1 minus the count model's on the same fold: mean and std over the folds. */
  cvDelta: { mean: number; std: number } | null;
  testF1: number;
  testDelta: { delta: number; ci: [number, number] } | null;
};

const meanStd = (xs: readonly number[]) => {
  const mean = xs.reduce((a, b) => a + b, 0) / xs.length;
  return { mean, std: Math.sqrt(xs.reduce((a, v) => a + (v - mean) ** 2, 0) / (xs.length - 1)) };
};

const countModel = (docs: readonly ColumnDocument[]) => trainTagger(docs, { calibration: "none" }).model;

/**
 * The count model and the neighbour-feature perceptron trained on `train` for each step, scored on
 * `heldOut` after each number of passes: scores[0] the count model's, then scores[1 + s·P + p − 1]
 * step s after p passes; with `predict`, the predicted tags per document too.
 */
function neighbourScores(train: readonly ColumnDocument[], heldOut: readonly ColumnDocument[], predict: boolean, steps: readonly number[], wordTypeOnly: boolean): { f1: number[]; tags: string[][][][] } {
  const counted = countModel(train);
  const f1: number[] = [];
  const tags: string[][][][] = [];
  const score = (model: TaggerModel) => {
    f1.push(evaluateModel(model, heldOut).entities!.overall.f1);
    if (predict) tags.push(heldOut.map((d) => tagDocument(model, d.sentences.map((s) => s.words))));
  };
  score(counted);
  for (const rate of steps) {
    if (wordTypeOnly) {
      // The word-type perceptron at the same steps (separate runs per number of passes).
      for (let passes = 1; passes <= NEIGHBOUR_PASSES; passes++) score({ ...counted, features: trainWordTypeWeights(counted, train, passes, countModel, rate) });
      continue;
    }
    const withTables = (t: { wordType: TaggerModel["features"]; neighbours: TaggerModel["neighbourFeatures"] }): TaggerModel => ({ ...counted, features: t.wordType, neighbourFeatures: t.neighbours });
    const last = trainNeighbourWeights(counted, train, NEIGHBOUR_PASSES, countModel, { rate, onPass: (tables) => score(withTables(tables)) });
    score(withTables(last));
  }
  return { f1, tags };
}

/**
 * What the CLI's selection (select-config.ts: 3-fold CV of the training data, 3,000 held-out
 * tokens per fold, then its refinements on a paired t-test) picks, per variant: the candidates'
 * scores, the refinements' per-fold gains and test, the choice, and the test F1 of the choice
 * trained on train+dev (calibration off) with the count model's for comparison.
 */
export function selectionReport(directory: string, variants = VARIANTS.map((v) => v.name)): Array<{ variant: string; scores: readonly { name: string; score: number }[]; refinements: SelectionResult["refinements"]; chosen: string; testF1: number; countTestF1: number; seconds: number }> {
  return VARIANTS.filter((v) => variants.includes(v.name)).map((variant) => {
    const { train, test } = variantTexts(directory, variant);
    const started = process.hrtime.bigint();
    const selection = selectConfiguration(train, {});
    const seconds = Number(process.hrtime.bigint() - started) / 1e9;
    const f1Of = (config: Partial<TrainingConfig>) => evaluateModel(trainTagger(train, { ...config, calibration: "none" }).model, test).entities!.overall.f1;
    return { variant: variant.name, scores: selection.scores, refinements: selection.refinements, chosen: selection.chosen.name, testF1: f1Of(selection.chosen.config), countTestF1: f1Of({}), seconds };
  });
}

/** The `neighbours` report of the file comment, per variant of bench/clusters.ts. */
export function neighbourReport(directory: string, variants = VARIANTS.map((v) => v.name), log?: (line: string) => void, steps = NEIGHBOUR_STEPS, wordTypeOnly = false): NeighbourRow[] {
  const names = ["count model (default)", ...steps.flatMap((rate) => Array.from({ length: NEIGHBOUR_PASSES }, (_, p) => `${wordTypeOnly ? "word-type" : "neighbours"}, ${p + 1} pass${p === 0 ? "" : "es"}, step ${rate}`))];
  const rows: NeighbourRow[] = [];
  for (const variant of VARIANTS.filter((v) => variants.includes(v.name))) {
    const { plan, train, test, gold } = variantTexts(directory, variant);
    const folds = plan.folds.map((heldOut, f) => {
      const started = process.hrtime.bigint();
      const r = neighbourScores(plan.folds.filter((_, g) => g !== f).flat(), heldOut, false, steps, wordTypeOnly).f1;
      log?.(`${variant.name} fold ${f + 1}: ${r.map((x) => x.toFixed(4)).join(" ")} (${(Number(process.hrtime.bigint() - started) / 1e9).toFixed(0)} s)`);
      return r;
    });
    const onTest = neighbourScores(train, test, true, steps, wordTypeOnly);
    names.forEach((name, i) => {
      const cv = meanStd(folds.map((r) => r[i]));
      const cvDelta = i === 0 ? null : meanStd(folds.map((r) => r[i] - r[0]));
      let testDelta: NeighbourRow["testDelta"] = null;
      if (i > 0) {
        const b = pairedBootstrap({ gold, a: onTest.tags[0], b: onTest.tags[i] }, { rng: createRng(7), samples: 2000 });
        testDelta = { delta: b.delta, ci: b.ci };
      }
      rows.push({ variant: variant.name, name, cvMean: cv.mean, cvStd: cv.std, cvDelta, testF1: onTest.f1[i], testDelta });
    });
  }
  return rows;
}

if (process.argv[1] !== undefined && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const here = fileURLToPath(new URL(".", import.meta.url));
  const shared = process.env.TAGLOOM_SHARED ?? ["../../../../shared", "../../../../../shared"].map((r) => resolve(here, r)).find((d) => existsSync(join(d, "data", "wikigold")))!;
  const what = process.argv[2];
  if (what === "brown-neighbours") {
    const passes = Number(process.argv[3] ?? 3);
    const r = brownFeatureReport(1000, { perceptron: passes, perceptronFeatures: "neighbours" });
    process.stdout.write(
      `Brown news POS, trigram: test token accuracy ${r.base.toFixed(4)} (train ${r.seconds[0].toFixed(0)} s); with neighbour perceptron, ${passes} passes ${r.features.toFixed(4)} (train ${r.seconds[1].toFixed(0)} s); Δ ${r.delta >= 0 ? "+" : ""}${r.delta.toFixed(4)} [${r.ci[0].toFixed(4)}, ${r.ci[1].toFixed(4)}]\n`,
    );
  } else if (what === "selection") {
    for (const r of selectionReport(join(shared, "data", "wikigold"), process.argv.length > 3 ? process.argv.slice(3) : undefined)) {
      const scores = r.scores.map((s) => `${s.name} ${s.score.toFixed(4)}`).join(", ");
      const refined = r.refinements.map((x) => `${x.name}: gains ${x.gains.map((g) => g.toFixed(4)).join("/")}, t ${x.t.toFixed(2)} (needs ${x.threshold}) ${x.taken ? "taken" : "not taken"}`).join("; ");
      process.stdout.write(`${r.variant.padEnd(7)} 3-fold selection: ${scores}; ${refined} (${r.seconds.toFixed(0)} s) → ${r.chosen}: test F1 ${r.testF1.toFixed(4)} (count model ${r.countTestF1.toFixed(4)})\n`);
    }
  } else if (what === "neighbours") {
    // Optional `steps=0.05,0.1` replaces NEIGHBOUR_STEPS, `word-type` trains the word-type
    // perceptron instead (the same steps and passes, no neighbour features); the other arguments
    // name variants.
    const args = process.argv.slice(3);
    const stepsArg = args.find((a) => a.startsWith("steps="));
    const steps = stepsArg === undefined ? undefined : stepsArg.slice(6).split(",").map(Number);
    const variants = args.filter((a) => a !== stepsArg && a !== "word-type");
    const rows = neighbourReport(join(shared, "data", "wikigold"), variants.length > 0 ? variants : undefined, (line) => process.stdout.write(`${line}\n`), steps, args.includes("word-type"));
    for (const r of rows) {
      const sign = (x: number) => `${x >= 0 ? "+" : ""}${x.toFixed(4)}`;
      const cvDelta = r.cvDelta === null ? "" : `  CV Δ ${sign(r.cvDelta.mean)} ± ${r.cvDelta.std.toFixed(4)}`;
      const delta = r.testDelta === null ? "" : `  test Δ ${sign(r.testDelta.delta)} [${r.testDelta.ci[0].toFixed(4)}, ${r.testDelta.ci[1].toFixed(4)}]`;
      process.stdout.write(`${r.variant.padEnd(7)} ${r.name.padEnd(34)} CV F1 ${r.cvMean.toFixed(4)} ± ${r.cvStd.toFixed(4)}${cvDelta}  test F1 ${r.testF1.toFixed(4)}${delta}\n`);
    }
  } else if (what !== "brown") {
    for (const r of clusterReport(join(shared, "data", "wikigold"), undefined, FEATURE_CONFIGURATIONS)) {
      const delta = r.testDelta === null ? "" : `  Δ ${r.testDelta.delta >= 0 ? "+" : ""}${r.testDelta.delta.toFixed(4)} [${r.testDelta.ci[0].toFixed(4)}, ${r.testDelta.ci[1].toFixed(4)}]`;
      process.stdout.write(`${r.variant.padEnd(7)} ${r.name.padEnd(34)} CV F1 ${r.cvMean.toFixed(4)} ± ${r.cvStd.toFixed(4)}  test F1 ${r.testF1.toFixed(4)}${delta}  (${r.seconds.toFixed(0)} s)\n`);
    }
  }
  if (what === undefined || what === "brown") {
    const r = brownFeatureReport();
    process.stdout.write(
      `Brown news POS, trigram: test token accuracy ${r.base.toFixed(4)} (train ${r.seconds[0].toFixed(0)} s); with word-type perceptron, 1 pass ${r.features.toFixed(4)} (train ${r.seconds[1].toFixed(0)} s); Δ ${r.delta >= 0 ? "+" : ""}${r.delta.toFixed(4)} [${r.ci[0].toFixed(4)}, ${r.ci[1].toFixed(4)}]\n`,
    );
  }
}
