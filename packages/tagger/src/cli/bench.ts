/**
 * Timing helpers shared by `tagger bench` and bench/run.ts (timing is I/O: it lives with the CLI,
 * never in the model package).
 */
import { createSyntheticCorpus, createViterbiWorkload } from "../kernels/synthetic";
import { segmentStartTable } from "../estimation/context-emissions";
import { countSupervised } from "../estimation/train";
import { decodeViterbi, decodeViterbiJs } from "../kernels/viterbi";
import { createSyntheticDocuments } from "../kernels/synthetic";
import { tagSentence, trainTagger } from "../model/tagger";

const seconds = (from: bigint) => Number(process.hrtime.bigint() - from) / 1e9;

/**
 * Tokens per second of our Viterbi on the C reference's workload shape (best of `repeats` passes),
 * called as the model's decoder calls it (decode.ts: path out, no workspace), so the WebAssembly
 * kernel's lattice stays in its memory as the C program's stays in its buffer; with a workspace
 * decodeViterbi also copies the T×K lattice out for the caller. With `javascript` the JavaScript
 * kernel that the tagging path calls (decodeViterbiJs, compiled per K) is timed instead.
 */
export function benchViterbi(states: number, tokens: number, repeats: number, javascript = false): number {
  const { params, emissionTable, words, sentenceStarts } = createViterbiWorkload(states, tokens);
  const out = new Int32Array(tokens);
  const sentences = sentenceStarts.length - 1;
  // Per-sentence views are prepared before timing, as the C program prepares its word ids.
  const inputs = Array.from({ length: sentences }, (_, s) => {
    const from = sentenceStarts[s];
    const to = sentenceStarts[s + 1];
    return { input: { length: to - from, scores: emissionTable, rows: words.subarray(from, to), transitionIndex: null }, out: out.subarray(from, to) };
  });
  let best = Infinity;
  for (let r = 0; r < repeats; r++) {
    const started = process.hrtime.bigint();
    if (javascript) for (let s = 0; s < sentences; s++) decodeViterbiJs(params, inputs[s].input, inputs[s].out);
    else for (let s = 0; s < sentences; s++) decodeViterbi(params, inputs[s].input, inputs[s].out);
    best = Math.min(best, seconds(started));
  }
  return tokens / best;
}

/**
 * Supervised counting throughput on an already-encoded corpus (best of `repeats`), 9 IOB2 states
 * and 20,000 symbols: with `tables` the previous-word and context-emission counts of the default
 * configuration are collected too, otherwise only start, transition, end and emission counts.
 */
export function benchTraining(tokens: number, repeats: number, tables = true): number {
  const corpus = createSyntheticCorpus(tokens, 9, 20000);
  const tags = ["O", "B-PER", "I-PER", "B-LOC", "I-LOC", "B-ORG", "I-ORG", "B-MISC", "I-MISC"];
  let best = Infinity;
  for (let r = 0; r < repeats; r++) {
    const started = process.hrtime.bigint();
    countSupervised(corpus, {
      states: 9,
      symbols: 20000,
      positionBuckets: { token: [], sentence: [] },
      prevWord: tables,
      trigrams: false,
      segmentStarts: tables ? segmentStartTable(tags, "iob") : null,
    });
    best = Math.min(best, seconds(started));
  }
  return tokens / best;
}

/**
 * End-to-end tagging throughput of the default configuration (calibrated span confidences
 * included): tagSentence from word strings to tags and span confidences, on `tokens` held-out
 * synthetic tokens (a different seed from the training documents, so many unknown words), after
 * a warm-up pass over other held-out text. One timed pass: the per-word-type caches start from
 * what the warm-up text filled, as a server's would. Tokens per second of wall-clock time, and
 * per second of the process's CPU time.
 */
export function benchTagging(trainTokens: number, tokens: number): { tokensPerSecond: number; cpuTokensPerSecond: number; spans: number } {
  const { model } = trainTagger(createSyntheticDocuments(trainTokens, 50000, 13));
  const sentences = (seed: number, n: number) => createSyntheticDocuments(n, 50000, seed).flatMap((d) => d.sentences.map((x) => x.words));
  for (const words of sentences(15, Math.min(tokens, 50_000))) tagSentence(model, words);
  const test = sentences(14, tokens);
  let spans = 0;
  const cpu = process.cpuUsage();
  const started = process.hrtime.bigint();
  for (const words of test) spans += tagSentence(model, words).chunks.length;
  const wall = seconds(started);
  const used = process.cpuUsage(cpu);
  // CPU seconds of the process over the pass (user + system, the collector's threads included):
  // on a shared machine the wall clock also counts the time other processes held the core.
  return { tokensPerSecond: tokens / wall, cpuTokensPerSecond: tokens / ((used.user + used.system) / 1e6), spans };
}
