/**
 * Active-learning simulation on wikigold (Balasuriya, Ringland, Nothman, Murphy & Curran 2009,
 * "Named Entity Recognition in Wikipedia"; CC BY 4.0, read from ../shared, never copied): the 116
 * train+dev articles are the pool, test.bio is the held-out score. Each seed starts from random
 * articles holding 10 % of the pool's tokens and adds, per round, the best-ranked articles until
 * another 10 % of the tokens is labelled (`--budget documents`: 10 % of the articles at the start
 * and per round), chosen by one strategy under the tagger trained so far (default configuration,
 * retrained every round), and scores entity F1 (CoNLL convention) on test.bio after every round.
 *
 * Strategies (Settles & Craven 2008, "An analysis of active learning strategies for sequence
 * labeling tasks", EMNLP, §3; every score from uncertaintyMeasures in src/model/uncertainty.ts):
 *   random                    the seed's shuffled order
 *   mean-token-entropy        token entropy averaged over the document (§3.1 TE; the product's old key)
 *   total-token-entropy       token entropy summed over the document (§3.1 TTE; favours long documents)
 *   least-confidence          1 − P(Viterbi sequence), averaged over sentences (§3.1 LC)
 *   least-confidence-sum      the same summed over sentences
 *   sequence-entropy          H(tag sequence | words), exact, summed over sentences (§3.1 SE)
 *   sequence-entropy-per-token  the same divided by the document's tokens
 *   span-mean                 mean over predicted spans of 1 − calibrated span confidence
 *   span-max                  the largest 1 − span confidence or probability of a missed entity
 *   expected-span-errors      Σ (1 − span confidence) + expected missed entities
 *   span-error-density        expected-span-errors per token
 *   density × X               X times the document's mean cosine similarity (tf-idf of lower-cased
 *                             words) to the unlabelled pool, β = 1 (§3.4 information density)
 *
 * A strategy that picks long documents labels more tokens per document, so strategies are compared
 * per tokens labelled, the fair budget (hence rounds of equal tokens, which keep the interpolation
 * gaps equal too: a gap of 40 % of the pool under a concave curve costs area by itself): each
 * curve's F1 is interpolated linearly over tokens and
 * its area is taken between the seed's tokens and the whole pool, divided by that width (the mean
 * F1 over the token budget; the same for all strategies at both ends). Per strategy: mean and sd
 * of that area over seeds, the paired difference from random per seed with a 95 % percentile
 * bootstrap interval over seeds (10,000 resamples) and a two-sided exact sign test. The same
 * area per documents labelled is printed beside it. Uses only the package's public API.
 *
 * Measured 2026-12-03 (8 seeds, token budget; mean F1 over the budget, paired difference from
 * random with its 95 % bootstrap interval, wins:losses over seeds): random 0.4936; the per-token
 * measures beat it a little and alike — mean-token-entropy +0.0075 [+0.0018, +0.0120] 7:1,
 * least-confidence +0.0101 [+0.0022, +0.0176] 6:2, sequence-entropy-per-token +0.0092 7:1,
 * span-error-density +0.0086 7:1, span-mean +0.0054 [−0.0056, +0.0148] 6:2 — and none beats
 * mean-token-entropy (paired: least-confidence +0.0027 [−0.0008, +0.0065], the others smaller).
 * The summed measures and span-max pick long articles and lose (−0.015 to −0.039, 0:8);
 * density weighting lowers every measure it was tried on. Per documents labelled
 * mean-token-entropy is below random (0.4896 vs 0.4945): it prefers short articles. So the
 * product keeps ranking by mean token entropy, and its view says how little that buys.
 *
 *   npx tsx bench/active-learning.ts [--json] [--seeds 5] [--budget tokens|documents] [--only a,b,...]
 */
import { readFileSync } from "node:fs";
import { join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { type ColumnDocument, type UncertaintyMeasures, createRng, evaluateModel, parseColumnText, toIob2, trainTagger, uncertaintyMeasures } from "../src/index";

const here = fileURLToPath(new URL(".", import.meta.url));
const shared = process.env.TAGLOOM_SHARED ?? resolve(here, "../../../../shared");
const directory = join(shared, "data", "wikigold");
const args = process.argv.slice(2);
const json = args.includes("--json");
const seedCount = args.includes("--seeds") ? Number(args[args.indexOf("--seeds") + 1]) : 5;
/** What a round adds: 10 % of the pool's documents, or documents until another 10 % of its tokens. */
const budget: "documents" | "tokens" = args.includes("--budget") && args[args.indexOf("--budget") + 1] === "documents" ? "documents" : "tokens";
const only = args.includes("--only") ? new Set(args[args.indexOf("--only") + 1]!.split(",")) : null;

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
const poolTokens = pool.map(tokensOf);
const allTokens = poolTokens.reduce((a, b) => a + b, 0);
const step = Math.round(pool.length / 10);

// Information density (§3.4): cosine similarity of tf-idf vectors of lower-cased words.
const similarity = (() => {
  const bags = pool.map((d) => {
    const bag = new Map<string, number>();
    for (const s of d.sentences) for (const w of s.words) bag.set(w.toLowerCase(), (bag.get(w.toLowerCase()) ?? 0) + 1);
    return bag;
  });
  const df = new Map<string, number>();
  for (const bag of bags) for (const w of bag.keys()) df.set(w, (df.get(w) ?? 0) + 1);
  const vectors = bags.map((bag) => {
    const v = new Map<string, number>();
    let norm = 0;
    for (const [w, tf] of bag) {
      const x = tf * Math.log(pool.length / df.get(w)!);
      v.set(w, x);
      norm += x * x;
    }
    norm = Math.sqrt(norm);
    for (const [w, x] of v) v.set(w, norm === 0 ? 0 : x / norm);
    return v;
  });
  const n = pool.length;
  const m = new Float64Array(n * n);
  for (let a = 0; a < n; a++) {
    for (let b = a; b < n; b++) {
      let dot = 0;
      const [small, large] = vectors[a]!.size < vectors[b]!.size ? [vectors[a]!, vectors[b]!] : [vectors[b]!, vectors[a]!];
      for (const [w, x] of small) dot += x * (large.get(w) ?? 0);
      m[a * n + b] = m[b * n + a] = dot;
    }
  }
  return m;
})();

function shuffled(n: number, seed: number): number[] {
  const rng = createRng(seed);
  const order = Array.from({ length: n }, (_, i) => i);
  for (let i = n - 1; i > 0; i--) {
    const j = rng.nextInt(i + 1);
    [order[i], order[j]] = [order[j]!, order[i]!];
  }
  return order;
}

type Score = (u: UncertaintyMeasures) => number;
const measures: Record<string, Score> = {
  "mean-token-entropy": (u) => u.meanEntropy,
  "total-token-entropy": (u) => u.totalEntropy,
  "least-confidence": (u) => u.leastConfidence,
  "least-confidence-sum": (u) => u.leastConfidenceSum,
  "sequence-entropy": (u) => u.sequenceEntropy ?? u.totalEntropy,
  "sequence-entropy-per-token": (u) => (u.tokens === 0 ? 0 : (u.sequenceEntropy ?? u.totalEntropy) / u.tokens),
  "span-mean": (u) => u.spanUncertaintyMean,
  "span-max": (u) => Math.max(u.spanUncertaintyMax, u.missedEntityMax),
  "expected-span-errors": (u) => u.expectedSpanErrors,
  "span-error-density": (u) => u.spanErrorDensity,
};
type Strategy = { name: string; score: Score | null; density: boolean };
const strategies: Strategy[] = [
  { name: "random", score: null, density: false },
  ...Object.entries(measures).map(([name, score]) => ({ name, score, density: false })),
  ...["mean-token-entropy", "sequence-entropy", "expected-span-errors", "span-error-density"].map((name) => ({ name: `density × ${name}`, score: measures[name]!, density: true })),
].filter((s) => only === null || s.name === "random" || only.has(s.name));

type Point = { documents: number; tokens: number; f1: number };

function curve(strategy: Strategy, seed: number): Point[] {
  const order = shuffled(pool.length, seed);
  const labelled = new Set<number>();
  let tokens = 0;
  let round = 1;
  // Documents: the seed's first `step` articles, then `step` more per round. Tokens: the seed's
  // first articles until 10 % of the pool's tokens, then the best-ranked until the next 10 %.
  const full = () => (budget === "documents" ? labelled.size >= Math.min(pool.length, step * round) : tokens >= Math.min(allTokens, (allTokens * round) / 10));
  const add = (i: number) => {
    labelled.add(i);
    tokens += poolTokens[i]!;
  };
  for (const i of order) {
    if (full()) break;
    add(i);
  }
  let randomNext = labelled.size;
  const points: Point[] = [];
  for (;;) {
    const docs = [...labelled].map((i) => pool[i]!);
    const { model } = trainTagger(docs);
    points.push({ documents: labelled.size, tokens, f1: evaluateModel(model, test).entities!.overall.f1 });
    if (labelled.size >= pool.length) return points;
    round++;
    if (strategy.score === null) {
      while (!full()) add(order[randomNext++]!);
      continue;
    }
    const open = order.filter((i) => !labelled.has(i));
    const n = pool.length;
    const scored = open
      .map((i) => {
        let score = strategy.score!(uncertaintyMeasures(model, pool[i]!.sentences.map((s) => s.words)));
        if (strategy.density) {
          let sum = 0;
          for (const j of open) if (j !== i) sum += similarity[i * n + j]!;
          score *= open.length > 1 ? sum / (open.length - 1) : 1;
        }
        return { i, score };
      })
      .sort((a, b) => b.score - a.score || a.i - b.i);
    for (const { i } of scored) {
      if (full()) break;
      add(i);
    }
  }
}

/** Mean of y over [x0, x1] of the piecewise-linear curve through the points (sorted by x). */
function meanOver(points: readonly { x: number; y: number }[]): number {
  let area = 0;
  for (let p = 1; p < points.length; p++) area += ((points[p]!.y + points[p - 1]!.y) / 2) * (points[p]!.x - points[p - 1]!.x);
  return area / (points[points.length - 1]!.x - points[0]!.x);
}

/** y at x on the piecewise-linear curve through the points (sorted by x). */
function at(points: readonly { x: number; y: number }[], x: number): number {
  for (let p = 1; p < points.length; p++) {
    const a = points[p - 1]!;
    const b = points[p]!;
    if (x <= b.x) return a.y + ((b.y - a.y) * (x - a.x)) / (b.x - a.x);
  }
  return points[points.length - 1]!.y;
}

const mean = (xs: readonly number[]) => xs.reduce((a, b) => a + b, 0) / xs.length;
const sd = (xs: readonly number[]) => (xs.length < 2 ? 0 : Math.sqrt(xs.reduce((a, x) => a + (x - mean(xs)) ** 2, 0) / (xs.length - 1)));

/** 95 % percentile bootstrap interval of the mean (Efron & Tibshirani 1993, "An Introduction to the Bootstrap", §13.3). */
function bootstrapMean(xs: readonly number[], resamples = 10_000): [number, number] {
  const rng = createRng(7);
  const means = new Float64Array(resamples);
  for (let r = 0; r < resamples; r++) {
    let s = 0;
    for (let k = 0; k < xs.length; k++) s += xs[rng.nextInt(xs.length)]!;
    means[r] = s / xs.length;
  }
  means.sort();
  return [means[Math.floor(0.025 * resamples)]!, means[Math.ceil(0.975 * resamples) - 1]!];
}

/** Two-sided exact sign test: P(a split at least as uneven as wins : losses | p = 1/2); ties dropped. */
function signTest(wins: number, losses: number): number {
  const n = wins + losses;
  if (n === 0) return 1;
  const k = Math.min(wins, losses);
  let tail = 0;
  let c = 1; // C(n, 0)
  for (let i = 0; i <= k; i++) {
    tail += c;
    c = (c * (n - i)) / (i + 1);
  }
  return Math.min(1, (2 * tail) / 2 ** n);
}

const started = process.hrtime.bigint();
const seeds = Array.from({ length: seedCount }, (_, s) => s + 1);
const curves = new Map<string, Point[][]>();
for (const strategy of strategies) {
  const t0 = process.hrtime.bigint();
  curves.set(strategy.name, seeds.map((seed) => curve(strategy, seed)));
  if (!json) process.stderr.write(`${strategy.name}: ${(Number(process.hrtime.bigint() - t0) / 1e9).toFixed(1)} s\n`);
}

const byTokens = (c: Point[]) => meanOver(c.map((p) => ({ x: p.tokens, y: p.f1 })));
const byDocuments = (c: Point[]) => meanOver(c.map((p) => ({ x: p.documents, y: p.f1 })));
const randomTokens = curves.get("random")!.map(byTokens);
// The product's ranking key before this comparison, for a paired difference of every other strategy from it.
const incumbent = curves.get("mean-token-entropy")?.map(byTokens) ?? null;
const grid = [0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9].map((f) => Math.round(f * allTokens));
const summary = strategies.map(({ name }) => {
  const runs = curves.get(name)!;
  const tokens = runs.map(byTokens);
  const documents = runs.map(byDocuments);
  const diff = tokens.map((a, s) => a - randomTokens[s]!);
  const wins = diff.filter((d) => d > 0).length;
  const losses = diff.filter((d) => d < 0).length;
  return {
    name,
    areaPerTokens: { mean: mean(tokens), sd: sd(tokens), perSeed: tokens },
    areaPerDocuments: { mean: mean(documents), sd: sd(documents) },
    versusRandom: { mean: mean(diff), interval: bootstrapMean(diff), wins, losses, signP: signTest(wins, losses) },
    versusMeanTokenEntropy: incumbent === null ? null : (() => {
      const d = tokens.map((a, s) => a - incumbent[s]!);
      const w = d.filter((x) => x > 0).length;
      const l = d.filter((x) => x < 0).length;
      return { mean: mean(d), interval: bootstrapMean(d), wins: w, losses: l, signP: signTest(w, l) };
    })(),
    f1AtTokens: grid.map((x) => mean(runs.map((c) => at(c.map((p) => ({ x: p.tokens, y: p.f1 })), x)))),
    // Rounds in order (under a token budget a long article can fill two rounds, so seeds may have fewer).
    rounds: runs[0]!.slice(0, Math.min(...runs.map((c) => c.length))).map((_, r) => ({
      documentsMean: mean(runs.map((c) => c[r]!.documents)),
      tokensMean: Math.round(mean(runs.map((c) => c[r]!.tokens))),
      f1Mean: mean(runs.map((c) => c[r]!.f1)),
      f1Sd: sd(runs.map((c) => c[r]!.f1)),
    })),
  };
});
const seconds = Number(process.hrtime.bigint() - started) / 1e9;

if (json) {
  process.stdout.write(`${JSON.stringify({ pool: pool.length, poolTokens: allTokens, budget, step, seeds, grid, summary, seconds }, null, 2)}\n`);
} else {
  const line = (s: string) => process.stdout.write(`${s}\n`);
  const f = (x: number) => x.toFixed(4);
  const signed = (x: number) => `${x >= 0 ? "+" : ""}${x.toFixed(4)}`;
  line(`Active learning on wikigold: pool ${pool.length} articles (${allTokens} tokens), +${budget === "tokens" ? "10 % of the tokens" : `${step} articles`} per round, ${seedCount} seeds, default config, entity F1 on test.bio`);
  line("");
  line("Mean F1 over the token budget (area under F1 per tokens labelled / width), paired with random per seed:");
  line(`${"strategy".padEnd(38)} | per tokens      | − random, 95% bootstrap    | wins:losses  sign p | per documents`);
  for (const s of summary) {
    const v = s.versusRandom;
    line(
      `${s.name.padEnd(38)} | ${f(s.areaPerTokens.mean)} ± ${f(s.areaPerTokens.sd)} | ${s.name === "random" ? "".padEnd(26) : `${signed(v.mean)} [${signed(v.interval[0])}, ${signed(v.interval[1])}]`} | ${s.name === "random" ? "".padEnd(19) : `${String(v.wins).padStart(2)}:${String(v.losses).padEnd(2)}  ${v.signP.toFixed(3).padStart(9)}`} | ${f(s.areaPerDocuments.mean)} ± ${f(s.areaPerDocuments.sd)}`,
    );
  }
  if (incumbent !== null) {
    line("");
    line("The same per tokens, paired with mean-token-entropy (the product's key before this comparison) per seed:");
    for (const s of summary) {
      const v = s.versusMeanTokenEntropy!;
      if (s.name === "mean-token-entropy") continue;
      line(`${s.name.padEnd(38)} | ${signed(v.mean)} [${signed(v.interval[0])}, ${signed(v.interval[1])}] | ${String(v.wins).padStart(2)}:${String(v.losses).padEnd(2)}  sign p ${v.signP.toFixed(3)}`);
    }
  }
  line("");
  line(`Mean F1 at tokens labelled (interpolated): ${grid.join(" ")}`);
  for (const s of summary) line(`${s.name.padEnd(38)} | ${s.f1AtTokens.map(f).join(" ")}`);
  line("");
  line("Per round: mean F1 (mean tokens labelled / mean documents)");
  for (const s of summary) line(`${s.name.padEnd(38)} | ${s.rounds.map((r) => `${r.f1Mean.toFixed(3)} (${r.tokensMean}/${Math.round(r.documentsMean)})`).join(" ")}`);
  line(`${seconds.toFixed(1)} s`);
}
