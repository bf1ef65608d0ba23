/**
 * Old build against new build of the tagging path, in one process, alternating (the machine is
 * shared: only ratios measured side by side mean anything). The old build is a copy of
 * packages/tagger/src from another commit:
 *
 *   git archive BASE packages/tagger/src | tar -x -C /tmp/base
 *   tsx bench/tagging-ab.ts /tmp/base/packages/tagger/src [rounds]
 *
 * First both builds tag the bench's text (`tagger bench`: default configuration, 200,000
 * training tokens, 50,000-token warm-up, 500,000 held-out tokens) and every tag, chunk, confidence
 * and log-likelihood is compared bit for bit; then each round times, for each build in turn (order
 * alternating), a pass whose caches were warmed on other text (as the bench's) and the same text
 * again (every word type cached), in CPU seconds of the process. Each pass gets a fresh shallow
 * copy of the model, so its per-model caches start empty.
 */
import { resolve } from "node:path";
import { pathToFileURL } from "node:url";
import { createSyntheticDocuments } from "../src/kernels/synthetic";
import type { TaggerModel } from "../src/model/tagger-model";

type Tagger = typeof import("../src/model/tagger");

const [oldDir, roundsArg] = process.argv.slice(2);
if (oldDir === undefined) throw new Error("usage: tsx bench/tagging-ab.ts OLD_SRC_DIR [rounds]");
const rounds = Number(roundsArg ?? 6);
const load = async (dir: string): Promise<Tagger> => (await import(pathToFileURL(resolve(dir, "model/tagger.ts")).href)) as Tagger;
const builds: [string, Tagger][] = [
  ["old", await load(oldDir)],
  ["new", await load(resolve(import.meta.dirname, "../src"))],
];

const sentences = (seed: number, n: number) => createSyntheticDocuments(n, 50000, seed).flatMap((d) => d.sentences.map((x) => x.words));
const { model } = builds[1][1].trainTagger(createSyntheticDocuments(200_000, 50000, 13));
const warm = sentences(15, 50_000);
const test = sentences(14, 500_000);
const tokens = test.reduce((n, s) => n + s.length, 0);

function warmed(tagger: Tagger): TaggerModel {
  const copy = { ...model };
  for (const words of warm) tagger.tagSentence(copy, words);
  return copy;
}

// Outputs: the same to the last bit (Object.is, so −0 and NaN count too).
{
  const [a, b] = [warmed(builds[0][1]), warmed(builds[1][1])];
  let differing = 0;
  let spans = 0;
  for (const [n, words] of test.entries()) {
    const x = builds[0][1].tagSentence(a, words);
    const y = builds[1][1].tagSentence(b, words);
    const same =
      Object.is(x.logLikelihood, y.logLikelihood) &&
      x.tags.length === y.tags.length &&
      x.tags.every((t, i) => t === y.tags[i]) &&
      x.chunks.length === y.chunks.length &&
      x.chunks.every((c, i) => c.type === y.chunks[i].type && c.start === y.chunks[i].start && c.end === y.chunks[i].end && Object.is(c.confidence, y.chunks[i].confidence));
    spans += x.chunks.length;
    if (!same && differing++ < 5) console.log(`sentence ${n} differs:`, JSON.stringify(x), JSON.stringify(y));
  }
  console.log(`compared ${test.length} sentences (${tokens} tokens, ${spans} spans): ${differing} differ`);
  if (differing > 0) process.exit(1);
}

/** CPU seconds of tagging sentences [from, to) of the test text. */
function cpuBlock(tagger: Tagger, copy: TaggerModel, from: number, to: number): number {
  const cpu = process.cpuUsage();
  for (let s = from; s < to; s++) tagger.tagSentence(copy, test[s]);
  const used = process.cpuUsage(cpu);
  return (used.user + used.system) / 1e6;
}

/**
 * One pass of each build over the test text, interleaved block by block (BLOCK sentences, the
 * build going first alternating), so both see the same load from the machine's other processes;
 * tokens per CPU second of each build's own blocks.
 */
const BLOCK = 500;
function interleavedPass(copies: TaggerModel[]): number[] {
  const seconds = [0, 0];
  for (let from = 0, b = 0; from < test.length; from += BLOCK, b++) {
    const to = Math.min(test.length, from + BLOCK);
    for (const x of b % 2 === 0 ? [0, 1] : [1, 0]) seconds[x] += cpuBlock(builds[x][1], copies[x], from, to);
  }
  return seconds.map((s) => tokens / s);
}

const ratios: { bench: number[]; again: number[] } = { bench: [], again: [] };
const k = (v: number) => `${Math.round(v / 1000)}k`;
for (let r = 0; r < rounds; r++) {
  const copies = r % 2 === 0 ? [warmed(builds[0][1]), warmed(builds[1][1])] : [warmed(builds[1][1]), warmed(builds[0][1])].reverse();
  const [oldBench, newBench] = interleavedPass(copies);
  const [oldAgain, newAgain] = interleavedPass(copies);
  ratios.bench.push(newBench / oldBench);
  ratios.again.push(newAgain / oldAgain);
  console.log(
    `round ${r + 1}: bench pass old ${k(oldBench)} new ${k(newBench)} (${(newBench / oldBench).toFixed(3)}), again old ${k(oldAgain)} new ${k(newAgain)} (${(newAgain / oldAgain).toFixed(3)}) tokens/CPU s`,
  );
}
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
if (rounds > 0) console.log(`median new/old of ${rounds} rounds: bench pass ${median(ratios.bench).toFixed(3)}, again ${median(ratios.again).toFixed(3)}`);
