import type { HmmParams } from "./hmm-params";
import { createRng } from "../util/random";
import type { EncodedCorpus } from "../estimation/train";

/**
 * The workload of the C reference shared/bench/viterbi_limit.c, generated the same way in shape:
 * K states with random finite log-probabilities (start in [−10, 0), transitions in [−10, 0),
 * emissions in [−20, 0) over V = 20,000 words), word ids uniform over V, sentence lengths uniform in
 * 10..30 (mean 20). Seeded, so every run decodes the same data.
 */
export function createViterbiWorkload(states: number, tokens: number, seed = 7): {
  params: HmmParams;
  emissionTable: Float64Array;
  words: Int32Array;
  sentenceStarts: Int32Array;
} {
  const rng = createRng(seed);
  const V = 20000;
  const K = states;
  const start = Float64Array.from({ length: K }, () => -10 * rng.next());
  const transitions = Float64Array.from({ length: K * K }, () => -10 * rng.next());
  const emissionTable = Float64Array.from({ length: V * K }, () => -20 * rng.next());
  const words = Int32Array.from({ length: tokens }, () => rng.nextInt(V));
  const starts = [0];
  let done = 0;
  while (done < tokens) {
    const length = Math.min(10 + rng.nextInt(21), tokens - done);
    done += length;
    starts.push(done);
  }
  return { params: { states: K, start, transitions, end: null }, emissionTable, words, sentenceStarts: Int32Array.from(starts) };
}

/**
 * An encoded labelled corpus for timing supervised counting: `tokens` tokens in sentences of
 * 10..30 tokens, K tags following a random sticky chain, V symbols with a Zipf-like skew.
 */
export function createSyntheticCorpus(tokens: number, states: number, symbols: number, seed = 11): EncodedCorpus {
  const rng = createRng(seed);
  const symbolIds = new Int32Array(tokens);
  const tags = new Int32Array(tokens);
  const starts = [0];
  let done = 0;
  while (done < tokens) {
    const length = Math.min(10 + rng.nextInt(21), tokens - done);
    let tag = rng.nextInt(states);
    for (let t = 0; t < length; t++) {
      if (rng.next() < 0.3) tag = rng.nextInt(states);
      tags[done + t] = tag;
      // Skewed word ids: the square of a uniform draw favours small ids, as word frequencies do.
      const u = rng.next();
      symbolIds[done + t] = Math.floor(u * u * symbols);
    }
    done += length;
    starts.push(done);
  }
  return { symbols: symbolIds, tags, sentenceStarts: Int32Array.from(starts), sentenceIndex: new Int32Array(starts.length - 1) };
}

/**
 * Labelled documents with `tokens` tokens for timing and memory measurements of the whole
 * training pipeline: 50 sentences per document, 10..30 tokens per sentence, words drawn from a
 * skewed distribution over `vocabulary` types (some capitalised), valid IOB2 tags over four
 * entity types.
 */
export function createSyntheticDocuments(tokens: number, vocabulary = 50000, seed = 13): { sentences: { words: string[]; tags: string[] }[] }[] {
  const rng = createRng(seed);
  const types = ["PER", "LOC", "ORG", "MISC"];
  const documents: { sentences: { words: string[]; tags: string[] }[] }[] = [];
  let done = 0;
  while (done < tokens) {
    const sentences: { words: string[]; tags: string[] }[] = [];
    for (let s = 0; s < 50 && done < tokens; s++) {
      const length = Math.min(10 + rng.nextInt(21), tokens - done);
      const words: string[] = [];
      const tags: string[] = [];
      let inside: string | null = null;
      for (let t = 0; t < length; t++) {
        const u = rng.next();
        const id = Math.floor(u * u * u * vocabulary);
        if (inside !== null && rng.next() < 0.5) {
          tags.push(`I-${inside}`);
        } else if (rng.next() < 0.1) {
          inside = types[rng.nextInt(types.length)];
          tags.push(`B-${inside}`);
        } else {
          inside = null;
          tags.push("O");
        }
        words.push(tags[t] === "O" ? `w${id}` : `W${id}`);
      }
      sentences.push({ words, tags });
      done += length;
    }
    documents.push({ sentences });
  }
  return documents;
}
