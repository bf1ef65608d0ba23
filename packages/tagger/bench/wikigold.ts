/**
 * wikigold accuracy report (Balasuriya, Ringland, Nothman, Murphy & Curran 2009, "Named Entity
 * Recognition in Wikipedia", People's Web Meets NLP; Nothman et al. 2013, Artificial Intelligence
 * 194; CC BY 4.0 — read from ../shared, never copied into the project).
 *
 * Cross-validation: train.bio and dev.bio have no -DOCSTART- lines, so the article boundaries are
 * recovered from raw/wikigold.conll.txt (145 articles; SOURCE.md's split puts article d in test when
 * d % 5 == 4): the 116 train+dev articles (IO tags converted to IOB2 as SOURCE.md describes; same
 * 1,399 sentences and 32,158 tokens as train.bio + dev.bio) are cut into 5 folds of contiguous
 * articles. Test: train on train.bio + dev.bio, score test.bio. Configurations are compared by
 * cross-validated F1 only; test F1 is reported, never used to choose.
 *
 * EM and sampling need unlabelled text; here it is the held-out text itself with its tags removed
 * (transductive: the held-out fold in cross-validation, test.bio's words for the test figure).
 */
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { toIob2 } from "../src/text/bio";
import { parseColumnText, type ColumnDocument } from "../src/text/conll";
import { planFolds } from "../src/evaluation/cross-validation";
import { evaluateModel } from "../src/evaluation/evaluation";
import { trainTagger } from "../src/model/tagger";
import type { TrainingConfig } from "../src/estimation/training-config";

export type WikigoldRow = { name: string; config: Partial<TrainingConfig>; cvMean: number; cvStd: number; testF1: number; seconds: number };

function read(directory: string, file: string): ColumnDocument[] {
  return parseColumnText(readFileSync(join(directory, file), "utf8"), { file }).documents;
}

/** The 116 train+dev articles, with IOB2 tags. */
export function wikigoldTrainDevArticles(directory: string): ColumnDocument[] {
  const raw = read(join(directory, "raw"), "wikigold.conll.txt");
  if (raw.length !== 145) throw new Error(`expected 145 articles in raw/wikigold.conll.txt, found ${raw.length}`);
  return raw.filter((_, d) => d % 5 !== 4).map((doc) => ({ sentences: doc.sentences.map((s) => ({ words: s.words, tags: toIob2(s.tags) })) }));
}

const words = (docs: readonly ColumnDocument[]) => docs.map((d) => d.sentences.map((s) => s.words));

function f1(config: Partial<TrainingConfig>, train: ColumnDocument[], test: ColumnDocument[]): number {
  const unlabelled = config.semi !== undefined && config.semi !== "none" ? words(test) : [];
  const { model } = trainTagger(train, config, { unlabelled });
  return evaluateModel(model, test).entities!.overall.f1;
}

export function wikigoldReport(directory: string, configurations: Array<{ name: string; config: Partial<TrainingConfig> }>, folds = 5): WikigoldRow[] {
  const articles = wikigoldTrainDevArticles(directory);
  const tokens = articles.reduce((n, d) => n + d.sentences.reduce((m, s) => m + s.words.length, 0), 0);
  if (tokens !== 32158) throw new Error(`train+dev articles hold ${tokens} tokens, expected 32158 (train.bio + dev.bio)`);
  const plan = planFolds(articles, folds);
  const train = [...read(directory, "train.bio"), ...read(directory, "dev.bio")];
  const test = read(directory, "test.bio");
  return configurations.map(({ name, config }) => {
    const started = process.hrtime.bigint();
    const scores = plan.folds.map((heldOut, f) => f1(config, plan.folds.filter((_, g) => g !== f).flat(), heldOut));
    const mean = scores.reduce((a, b) => a + b, 0) / scores.length;
    const std = Math.sqrt(scores.reduce((a, v) => a + (v - mean) ** 2, 0) / (scores.length - 1));
    const testF1 = f1(config, train, test);
    return { name, config, cvMean: mean, cvStd: std, testF1, seconds: Number(process.hrtime.bigint() - started) / 1e9 };
  });
}

/** The configurations the report compares (each differs from the default in one respect unless named otherwise). */
export const WIKIGOLD_CONFIGURATIONS: Array<{ name: string; config: Partial<TrainingConfig> }> = [
  { name: "default (informal classes, suffixes, previous-word, context emissions)", config: {} },
  { name: "word classes: extended (no informal-text classes)", config: { wordClasses: "extended" } },
  { name: "first-order, word classes only (no prev-word, no context emissions)", config: { prevWord: false, contextEmissions: false } },
  { name: "word classes: bikel", config: { wordClasses: "bikel" } },
  { name: "word classes: none (one unknown-word symbol)", config: { wordClasses: "none" } },
  { name: "suffixes off", config: { suffixLength: 0 } },
  { name: "lower-case fallback for sentence-initial words off", config: { lowercaseFirstWord: false } },
  { name: "previous-word off", config: { prevWord: false } },
  { name: "context emissions off", config: { contextEmissions: false } },
  { name: "trigram (order 2, deleted interpolation)", config: { order: 2 } },
  { name: "position-aware: token 1,2,4", config: { positionBuckets: { token: [1, 2, 4], sentence: [] } } },
  { name: "position-aware: token 1,2 / sentence 1", config: { positionBuckets: { token: [1, 2], sentence: [1] } } },
  { name: "EM, 5 iterations, weight 0.1 (transductive)", config: { semi: "em", iterations: 5, weight: 0.1 } },
  { name: "EM, 5 iterations, weight 1 (transductive)", config: { semi: "em", iterations: 5, weight: 1 } },
  { name: "sampling, 5 iterations, weight 0.1 (transductive)", config: { semi: "sample", iterations: 5, weight: 0.1 } },
  { name: "nltk-compatible, γ = 0.1", config: { nltkCompatible: true } },
];
