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
 * Calibration is off: it does not change tags or F1.
 */
import { existsSync } from "node:fs";
import { join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { clusterReport } from "./clusters";
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

/** Brown news test token accuracy, trigram with and without 1 pass over word-type features; bootstrap over documents. */
export function brownFeatureReport(samples = 1000): { base: number; features: number; delta: number; ci: [number, number]; seconds: [number, number] } {
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
  const b = correct({ ...TRIGRAM, perceptron: 1, perceptronFeatures: "word-type" });
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

if (process.argv[1] !== undefined && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const here = fileURLToPath(new URL(".", import.meta.url));
  const shared = process.env.TAGLOOM_SHARED ?? ["../../../../shared", "../../../../../shared"].map((r) => resolve(here, r)).find((d) => existsSync(join(d, "data", "wikigold")))!;
  const what = process.argv[2];
  if (what !== "brown") {
    for (const r of clusterReport(join(shared, "data", "wikigold"), undefined, FEATURE_CONFIGURATIONS)) {
      const delta = r.testDelta === null ? "" : `  Δ ${r.testDelta.delta >= 0 ? "+" : ""}${r.testDelta.delta.toFixed(4)} [${r.testDelta.ci[0].toFixed(4)}, ${r.testDelta.ci[1].toFixed(4)}]`;
      process.stdout.write(`${r.variant.padEnd(7)} ${r.name.padEnd(34)} CV F1 ${r.cvMean.toFixed(4)} ± ${r.cvStd.toFixed(4)}  test F1 ${r.testF1.toFixed(4)}${delta}  (${r.seconds.toFixed(0)} s)\n`);
    }
  }
  if (what !== "wikigold") {
    const r = brownFeatureReport();
    process.stdout.write(
      `Brown news POS, trigram: test token accuracy ${r.base.toFixed(4)} (train ${r.seconds[0].toFixed(0)} s); with word-type perceptron, 1 pass ${r.features.toFixed(4)} (train ${r.seconds[1].toFixed(0)} s); Δ ${r.delta >= 0 ? "+" : ""}${r.delta.toFixed(4)} [${r.ci[0].toFixed(4)}, ${r.ci[1].toFixed(4)}]\n`,
    );
  }
}
