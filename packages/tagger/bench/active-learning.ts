/**
 * Active-learning simulation on wikigold (Balasuriya, Ringland, Nothman, Murphy & Curran 2009,
 * "Named Entity Recognition in Wikipedia"; CC BY 4.0, read from ../shared, never copied): the 116
 * train+dev articles are the pool, test.bio is the held-out score. Each seed starts from a random
 * 10 % of the articles and adds 10 % of the pool per round, chosen either
 *   (a) by the product's ranking: the highest mean token entropy of the posterior marginals under
 *       the tagger trained so far (documentUncertainty(...).meanEntropy, as the "Most uncertain"
 *       view ranks), or
 *   (b) at random,
 * training with the default configuration every round and scoring entity F1 (CoNLL convention)
 * on test.bio. Both curves are printed with the mean and spread over 5 seeds, per round, as
 * documents and tokens labelled. Uses only the package's public API (src/index.ts).
 *
 *   npx tsx bench/active-learning.ts [--json] [--seeds 5]
 */
import { readFileSync } from "node:fs";
import { join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { type ColumnDocument, createRng, documentUncertainty, evaluateModel, parseColumnText, toIob2, trainTagger } from "../src/index";

const here = fileURLToPath(new URL(".", import.meta.url));
const shared = process.env.TAGLOOM_SHARED ?? resolve(here, "../../../../shared");
const directory = join(shared, "data", "wikigold");
const args = process.argv.slice(2);
const json = args.includes("--json");
const seedCount = args.includes("--seeds") ? Number(args[args.indexOf("--seeds") + 1]) : 5;

function read(file: string): ColumnDocument[] {
  return parseColumnText(readFileSync(file, "utf8"), { file }).documents;
}

// train.bio and dev.bio have no article boundaries; raw/wikigold.conll.txt has them (SOURCE.md:
// article d is in test when d % 5 == 4; IO tags become IOB2).
const raw = read(join(directory, "raw", "wikigold.conll.txt"));
if (raw.length !== 145) throw new Error(`expected 145 articles, found ${raw.length}`);
const pool = raw.filter((_, d) => d % 5 !== 4).map((doc) => ({ sentences: doc.sentences.map((s) => ({ words: s.words, tags: toIob2(s.tags) })) }));
const test = read(join(directory, "test.bio"));
const tokensOf = (d: ColumnDocument) => d.sentences.reduce((n, s) => n + s.words.length, 0);
const step = Math.round(pool.length / 10);

function shuffled(n: number, seed: number): number[] {
  const rng = createRng(seed);
  const order = Array.from({ length: n }, (_, i) => i);
  for (let i = n - 1; i > 0; i--) {
    const j = rng.nextInt(i + 1);
    [order[i], order[j]] = [order[j]!, order[i]!];
  }
  return order;
}

type Point = { documents: number; tokens: number; f1: number };

function curve(strategy: "uncertainty" | "random", seed: number): Point[] {
  const order = shuffled(pool.length, seed);
  const labelled = new Set(order.slice(0, step));
  let randomNext = step;
  const points: Point[] = [];
  for (;;) {
    const docs = [...labelled].map((i) => pool[i]!);
    const { model } = trainTagger(docs);
    points.push({ documents: labelled.size, tokens: docs.reduce((n, d) => n + tokensOf(d), 0), f1: evaluateModel(model, test).entities!.overall.f1 });
    if (labelled.size >= pool.length) return points;
    const take = Math.min(step, pool.length - labelled.size);
    if (strategy === "random") {
      for (let k = 0; k < take; k++) labelled.add(order[randomNext++]!);
      continue;
    }
    const scored = order
      .filter((i) => !labelled.has(i))
      .map((i) => ({ i, score: documentUncertainty(model, pool[i]!.sentences.map((s) => s.words)).meanEntropy }))
      .sort((a, b) => b.score - a.score || a.i - b.i);
    for (const { i } of scored.slice(0, take)) labelled.add(i);
  }
}

const mean = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / xs.length;
const sd = (xs: number[]) => (xs.length < 2 ? 0 : Math.sqrt(xs.reduce((a, x) => a + (x - mean(xs)) ** 2, 0) / (xs.length - 1)));

const started = process.hrtime.bigint();
const seeds = Array.from({ length: seedCount }, (_, s) => s + 1);
const result = Object.fromEntries(
  (["uncertainty", "random"] as const).map((strategy) => {
    const runs = seeds.map((seed) => curve(strategy, seed));
    const rounds = runs[0]!.map((_, r) => ({
      documents: runs[0]![r]!.documents,
      tokensMean: Math.round(mean(runs.map((c) => c[r]!.tokens))),
      f1Mean: mean(runs.map((c) => c[r]!.f1)),
      f1Sd: sd(runs.map((c) => c[r]!.f1)),
    }));
    return [strategy, rounds];
  }),
) as Record<"uncertainty" | "random", Array<{ documents: number; tokensMean: number; f1Mean: number; f1Sd: number }>>;

// The fewest labelled documents at which the uncertainty curve reaches the random curve's F1
// before its last round (the last round labels the whole pool in both, so it is equal there).
const randomBeforeLast = result.random[result.random.length - 2]!;
const reached = result.uncertainty.find((p) => p.f1Mean >= randomBeforeLast.f1Mean);
const seconds = Number(process.hrtime.bigint() - started) / 1e9;

if (json) {
  process.stdout.write(`${JSON.stringify({ pool: pool.length, step, seeds, result, randomBeforeLast, reachedAt: reached?.documents ?? null, seconds }, null, 2)}\n`);
} else {
  const line = (s: string) => process.stdout.write(`${s}\n`);
  line(`Active learning on wikigold: pool ${pool.length} articles, +${step} per round, ${seedCount} seeds, default config, entity F1 on test.bio (mean ± sd)`);
  line("documents | uncertainty F1 (tokens)     | random F1 (tokens)");
  result.uncertainty.forEach((u, r) => {
    const x = result.random[r]!;
    line(`${String(u.documents).padStart(9)} | ${u.f1Mean.toFixed(4)} ± ${u.f1Sd.toFixed(4)} (${String(u.tokensMean).padStart(6)}) | ${x.f1Mean.toFixed(4)} ± ${x.f1Sd.toFixed(4)} (${String(x.tokensMean).padStart(6)})`);
  });
  line(
    reached
      ? `uncertainty reaches random's F1 at ${randomBeforeLast.documents} documents (${randomBeforeLast.f1Mean.toFixed(4)}) with ${reached.documents} documents`
      : `uncertainty does not reach random's F1 at ${randomBeforeLast.documents} documents (${randomBeforeLast.f1Mean.toFixed(4)}) before the whole pool is labelled`,
  );
  line(`${seconds.toFixed(1)} s`);
}
