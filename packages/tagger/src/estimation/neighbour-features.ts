/**
 * Features of the words around a token for the averaged perceptron (perceptron.ts), conjoined with
 * the token's tag by the weights' (feature, tag) layout. Collins (2002), "Discriminative training
 * methods for hidden Markov models", §3, scores the part-of-speech templates of Ratnaparkhi (1996),
 * "A maximum entropy model for part-of-speech tagging", Table 1, which include the surrounding
 * words w_{i-2}, w_{i-1}, w_{i+1}, w_{i+2} with the tag t_i, while the model keeps its first-order
 * tag transitions and Viterbi decoding: a token's emission score for tag k gains the weights of its
 * neighbours' features for k. In informal text capitalisation says little, so the words around a
 * name carry much of the signal ("met", "in", "@"): here the lower-cased form of w±1 and w±2, and
 * the informal word class and shape (word-type-features.ts) of w±1. A neighbour outside the
 * sentence is `<s>` on the left and `</s>` on the right, so `w-1=<s>` is the sentence-initial flag
 * and `w+1=</s>` the sentence-final one.
 *
 * A word's features as a neighbour depend only on the word, its offset from the token and whether
 * it is the sentence's first word (its class carries the position), so the summed weights of each
 * (word, first) for the four offsets are cached as one 4×K row; tagging then adds, per token, four
 * cached K-vectors to the emission row after its per-word-type row was built
 * ({@link addNeighbourWeights}), with no allocation once the words are cached.
 */
import { wordClassNames, wordClassOf } from "./word-features";
import { wordShape, type FeatureWeights } from "./word-type-features";

/** Offsets of the neighbours, in the order their features are listed and summed. */
export const NEIGHBOUR_OFFSETS: readonly number[] = [-2, -1, 1, 2];

const label = (offset: number): string => (offset > 0 ? `+${offset}` : `${offset}`);

/**
 * Feature strings of `word` as the neighbour at `offset` (±1 or ±2) of a token, `first` when the
 * word is token 0: `w±d=` its lower-cased form; for |offset| = 1 also `class±1=` its informal word
 * class and `shape±1=` its shape.
 */
export function neighbourWordFeatures(word: string, first: boolean, offset: number): string[] {
  const d = label(offset);
  const out = [`w${d}=${word.toLowerCase()}`];
  if (offset === 1 || offset === -1) out.push(`class${d}=${wordClassNames("informal")[wordClassOf(word, first, "informal")]}`, `shape${d}=${wordShape(word)}`);
  return out;
}

/** The feature of a neighbour position outside the sentence (before its start or after its end). */
export function boundaryFeature(offset: number): string {
  return `w${label(offset)}=${offset < 0 ? "<s>" : "</s>"}`;
}

/** Feature strings of token t of a sentence, neighbour by neighbour in NEIGHBOUR_OFFSETS order. */
export function neighbourFeatures(words: readonly string[], t: number): string[] {
  const out: string[] = [];
  for (const offset of NEIGHBOUR_OFFSETS) {
    const j = t + offset;
    if (j < 0 || j >= words.length) out.push(boundaryFeature(offset));
    else out.push(...neighbourWordFeatures(words[j], j === 0, offset));
  }
  return out;
}

/** Word types whose neighbour rows are kept per table before the cache starts afresh. */
const NEIGHBOUR_CACHE_LIMIT = 1 << 16;

/** Per table: summed neighbour weights per (word, first) and the boundary rows. */
type NeighbourCache = {
  /** Word → row number, for words not at position 0 and at position 0. */
  readonly rest: Map<string, number>;
  readonly first: Map<string, number>;
  /** Row r, offset slot o (NEIGHBOUR_OFFSETS index), tag k: rows[(r·4 + o)·K + k]. */
  rows: Float64Array;
  count: number;
  /** Slot o: the boundary feature's weights (zeros when the table lacks it). */
  readonly boundary: Float64Array;
  readonly sum: Float64Array;
  /** Row number of each token of the sentence being summed. */
  tokenRows: Int32Array;
};

const caches = new WeakMap<FeatureWeights, NeighbourCache>();

function cacheOf(table: FeatureWeights): NeighbourCache {
  let cache = caches.get(table);
  if (cache === undefined) {
    const K = table.states;
    const slots = NEIGHBOUR_OFFSETS.length;
    const boundary = new Float64Array(slots * K);
    NEIGHBOUR_OFFSETS.forEach((offset, o) => {
      const f = table.index.get(boundaryFeature(offset));
      if (f !== undefined) for (let k = 0; k < K; k++) boundary[o * K + k] = table.weights[f * K + k];
    });
    cache = { rest: new Map(), first: new Map(), rows: new Float64Array(256 * slots * K), count: 0, boundary, sum: new Float64Array(K), tokenRows: new Int32Array(64) };
    caches.set(table, cache);
  }
  return cache;
}

/** Row number of a word's summed neighbour weights, computed on first sight. */
function rowOf(table: FeatureWeights, cache: NeighbourCache, word: string, first: boolean): number {
  const map = first ? cache.first : cache.rest;
  const found = map.get(word);
  if (found !== undefined) return found;
  const K = table.states;
  const slots = NEIGHBOUR_OFFSETS.length;
  const row = cache.count++;
  if ((row + 1) * slots * K > cache.rows.length) {
    const next = new Float64Array(2 * cache.rows.length);
    next.set(cache.rows);
    cache.rows = next;
  }
  const rows = cache.rows;
  NEIGHBOUR_OFFSETS.forEach((offset, o) => {
    const at = (row * slots + o) * K;
    for (let k = 0; k < K; k++) rows[at + k] = 0;
    for (const name of neighbourWordFeatures(word, first, offset)) {
      const f = table.index.get(name);
      if (f !== undefined) for (let k = 0; k < K; k++) rows[at + k] += table.weights[f * K + k];
    }
  });
  map.set(word, row);
  return row;
}

/**
 * Adds to each token t of a sentence the summed weights of its neighbours' features, per tag:
 * logRows[t·K + k] += Σ over the four offsets (NEIGHBOUR_OFFSETS order, from 0) of the neighbour's
 * cached weights; `expRows`, when given, gets exp of the new log scores (the tagging path's
 * probability lattice). `logRows` is T×K (T = words.length), row-major.
 */
export function addNeighbourWeights(table: FeatureWeights, words: readonly string[], logRows: Float64Array, expRows: Float64Array | null): void {
  const cache = cacheOf(table);
  const K = table.states;
  const T = words.length;
  const slots = NEIGHBOUR_OFFSETS.length;
  // Start afresh between sentences only, so that this sentence's rows stay valid while it is summed.
  if (cache.count + T > NEIGHBOUR_CACHE_LIMIT) {
    cache.rest.clear();
    cache.first.clear();
    cache.count = 0;
  }
  // One lookup per token: each word's row, then the sums read them at their offsets.
  if (cache.tokenRows.length < T) cache.tokenRows = new Int32Array(Math.max(T, 2 * cache.tokenRows.length));
  const tokenRows = cache.tokenRows;
  for (let t = 0; t < T; t++) tokenRows[t] = rowOf(table, cache, words[t], t === 0);
  const rows = cache.rows;
  const sum = cache.sum;
  const boundary = cache.boundary;
  for (let t = 0; t < T; t++) {
    for (let k = 0; k < K; k++) sum[k] = 0;
    for (let o = 0; o < slots; o++) {
      const j = t + NEIGHBOUR_OFFSETS[o];
      if (j < 0 || j >= T) {
        for (let k = 0; k < K; k++) sum[k] += boundary[o * K + k];
      } else {
        const at = (tokenRows[j] * slots + o) * K;
        for (let k = 0; k < K; k++) sum[k] += rows[at + k];
      }
    }
    const out = t * K;
    for (let k = 0; k < K; k++) logRows[out + k] += sum[k];
    if (expRows !== null) for (let k = 0; k < K; k++) expRows[out + k] = Math.exp(logRows[out + k]);
  }
}
