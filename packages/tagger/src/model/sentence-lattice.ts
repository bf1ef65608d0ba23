import { contextEmissionLogRatio } from "../estimation/context-emissions";
import { findEntry } from "../estimation/count-table";
import { prevWordRow } from "../estimation/estimate";
import { interpolateWittenBell } from "../estimation/smoothing";
import { classOf, suffixGroupOf, type Vocabulary } from "../estimation/vocabulary";
import { addEmissionAdjustments, addTokenAdjustments, emissionRowIsOwn } from "../estimation/emission-adjustments";
import { createScaledWorkspace, type ScaledWorkspace } from "../kernels/forward-backward-scaled";
import { createViterbiWorkspace, type ViterbiWorkspace } from "../kernels/viterbi";
import { addNodeLogRatio, createSuffixTrie, suffixNode, type SuffixTrie } from "./suffix-trie";
import type { TaggerModel } from "./tagger-model";
import { clearPairs, createPairTable, getPair, setPair, type PairTable } from "./pair-table";
import { clearWords, createWordTable, findHashedWord, firstProbe, hashWord, insertHashedWord, type WordTable } from "./word-table";

/**
 * The tagging path's first-order lattice of one sentence, built from per-model caches instead of
 * hashing and interpolating at every token. It holds the same log scores as
 * buildFirstOrderProblem (decode-input.ts), each computed by the same arithmetic from the same
 * counts, plus their probabilities for the scaled forward-backward:
 *
 * - per word type (and sentence-initial or not): its symbol and its emission row (table row, plus
 *   the suffix log-ratio for unknown words), log and exp;
 * - per previous symbol: the K×K transition rows (Witten–Bell over the previous-word counts, IOB2
 *   constraints) with the context-emission ratio of the symbol-free case folded in: a context
 *   whose count for the current word is 0 gives log(u/(n + u)) whatever the word;
 * - per current symbol: the few (context, state) cells where that word was seen in a state
 *   context (a segment start) or at the sentence start, which replace the folded-in value.
 *
 * Only first-order models without position buckets and without the NLTK tables take this path
 * ({@link fastLatticeApplies}); the others keep the general builder.
 */

/** Most cached word types (and emission rows) before the word cache starts afresh (bounds memory). */
const MAX_WORD_ENTRIES = 1 << 17;
/**
 * Previous-symbol matrices are bounded by their total size (K² numbers each, three arrays), so a
 * small tag set keeps a matrix for every symbol of a typical vocabulary instead of starting
 * afresh every few sentences (which recomputed each matrix's Witten–Bell rows and K² exps).
 */
const MAX_PREVIOUS_NUMBERS = 1 << 22;
const previousLimit = (K: number): number => Math.max(1 << 13, Math.floor(MAX_PREVIOUS_NUMBERS / (K * K)));
/**
 * Patched step columns, per (previous symbol, symbol) pair whose word overrides cells, are kept
 * in a direct-mapped pool (each pair has one place, chosen by hashing, where it replaces the pair
 * there before it) bounded by its size (K² numbers each, two arrays). A place holds only the
 * columns its pair patches (mostly one), so only those are ever read or written: the larger pool
 * (2^22 numbers rather than 2^18, when a place was a whole matrix copy) keeps more of the bench's
 * bigrams (simulated on the bench's text: 0.60 of the patched steps find their pair with 16,384
 * places, 0.72 with 65,536, against 0.40 with 1,024 (the old pool had 2,048);
 * K = 9 now has up to 32,768 places), and measured 1.07 times as fast on the bench pass. A pair
 * that overrides no cell is remembered there too.
 */
const MAX_POOL_NUMBERS = 1 << 22;
/**
 * At most this many places, whatever K: a small tag set would otherwise get hundreds of thousands
 * of places, and every model copy (the CLI's warm-up tags with throw-away copies) its own.
 */
const MAX_POOL_PLACES = 1 << 15;
const INITIAL_POOL_PLACES = 1 << 10;
/**
 * Pool places at most: the smallest power of two whose 2·K² numbers per place exceed
 * MAX_POOL_NUMBERS, at least 256 and at most MAX_POOL_PLACES. A cache starts with
 * INITIAL_POOL_PLACES (or fewer) and takes the full pool, in one step, once it has placed as many
 * pairs as that: a short-lived cache (the CLI's warm-up copies of a small file, a
 * cross-validation fold) stays small, a long-lived one moves its matrices only once.
 */
function poolSizeFor(K: number): number {
  let size = 256;
  while (2 * size * K * K <= MAX_POOL_NUMBERS && size < MAX_POOL_PLACES) size *= 2;
  return size;
}

/** The lattice of the last sentence built (buffers reused from sentence to sentence). */
export type SentenceLattice = {
  length: number;
  symbols: Int32Array;
  /** K log / probability start scores (start distribution plus the sentence-start context ratio). */
  logStart: Float64Array;
  start: Float64Array;
  /**
   * Per-step transition scores, column by column: the score of state i → state j at step t
   * (t ≥ 1) is logSteps[columns[t·K + j] + i] (log) and steps[columns[t·K + j] + i]
   * (probability). These arrays are the model cache's own (column-major matrices per previous
   * symbol, after a patch area where the columns that a step's word overrides are written), so a
   * step copies only the columns its word changes.
   */
  logSteps: Float64Array;
  steps: Float64Array;
  /** T×K emission scores, log and probability. */
  logEmissions: Float64Array;
  emissions: Float64Array;
  /** K end probabilities, or null. */
  end: Float64Array | null;
  /** T×K column offsets into logSteps/steps (row 0 unused). */
  columns: Int32Array;
  /**
   * K×K, 0 where every step's score is −Infinity (probability 0): the IOB2 constraints' forbidden
   * transitions, checked on every matrix the cache builds; null when unconstrained or when a
   * matrix broke that (the kernels then read every cell).
   */
  allowed: Uint8Array | null;
  /** Buffers of the scaled forward-backward over this lattice. */
  scaled: ScaledWorkspace;
  /** Emission row of each token in the model cache (see Cache.wordRows). */
  rows: Int32Array;
  /** hashWord of each token (with its position). */
  hashes: Int32Array;
  /** Buffers of the Viterbi pass over this lattice, and its path (T entries used). */
  viterbi: ViterbiWorkspace;
  path: Int32Array;
};

type Cache = {
  K: number;
  /** (word, sentence-initial) → emission row. */
  words: WordTable;
  /**
   * The vocabulary's words → their ids, in a table of the same kind with every word stored as not
   * sentence-initial, so a new word type's lookup reuses its token hash (the tokens after the first).
   */
  known: WordTable;
  /**
   * Emission rows shared by the word types that have the same scores: 2K + 1 numbers side by
   * side (one or two cache lines for a token): the symbol, K emission log scores, their K exps.
   * A symbol's own row serves every word read as that symbol without a suffix ratio; the others
   * have one row per (symbol, suffix trie node).
   */
  wordRows: Float64Array;
  rowCount: number;
  /** Row of each symbol's plain scores, or −1. */
  symbolRows: Int32Array;
  /** (symbol, suffix trie node) → emission row. */
  suffixRows: PairTable;
  previousSlot: Int32Array;
  /** Per previous slot, K×K: transition log scores before the context-emission ratio. */
  previousBase: Float64Array;
  /**
   * The same with the context-free context-emission ratio added, and its exp, as column-major
   * K×K matrices (cell (i, j) of matrix m at m·K² + j·K + i): matrix 0 holds the plain
   * transitions of models without previous-word or context tables, matrices 1..poolSize the pool
   * of patched columns (place h is matrix 1 + h: the pair's patched columns at their own
   * positions, the others unused), matrices poolSize + 1 + t this sentence's step t when its pool
   * place is taken by a pair this sentence uses, and slot s is matrix patches + s.
   */
  previousLog: Float64Array;
  previousExp: Float64Array;
  patches: number;
  /**
   * The pool's places, 4 ints each: previous symbol + 1 (0 = empty), symbol, the pair's matrix
   * (0 when the pair overrides no cell: the previous symbol's slot matrix serves), and the number
   * of the sentence that last wrote the place (a place that sentence's steps read is not replaced).
   */
  poolKeys: Int32Array;
  /** Per place and state j: 1 when the place's matrix holds the pair's patched column j. */
  poolColumns: Uint8Array;
  /** Per state j: the patch number that last copied column j (patchCount when it is patched now). */
  columnMark: Int32Array;
  patchCount: number;
  poolSize: number;
  /** Pairs placed in the pool (counted until it has its full size). */
  poolPlaced: number;
  sentence: number;
  /** Per symbol: 1 when some inside-segment context (a previous symbol) was seen followed by it. */
  pairSymbols: Uint8Array;
  /**
   * A Bloom filter over the (previous symbol, symbol) pairs of `pairIndex` (Bloom 1970,
   * "Space/time trade-offs in hash coding with allowable errors", CACM 13(7); two hash functions):
   * a pair it rejects is certainly absent, so most steps skip the large index.
   */
  pairFilter: Uint32Array;
  /** Per previous slot and state j: 1 when the context "previous word" has a row for state j. */
  previousHasRow: Uint8Array;
  /** Per previous slot: 1 when any state has an inside-segment context row for that symbol. */
  previousAnyRow: Uint8Array;
  /**
   * Per previous slot and state i: 1 when row i of its transition scores is its own (the
   * previous word has Witten–Bell counts there), 0 when it is the model's plain row.
   */
  previousOwnRow: Uint8Array;
  previousCount: number;
  /**
   * Per symbol, CSR of the segment-start cells (i·K + j, context i) and start states (K·K + j,
   * context K) where that symbol has a count, with the exact log context-emission ratio there.
   */
  exceptionOffsets: Int32Array | null;
  exceptionCells: Int32Array | null;
  exceptionRatios: Float64Array | null;
  /**
   * Per exception (segment cells): its step score after a previous word whose row i is the plain
   * one, transitions(i, j) + the exact ratio, log and exp, so most patched cells cost no exp.
   */
  exceptionLog: Float64Array | null;
  exceptionExp: Float64Array | null;
  /** Per exception: its cell's column j and column-major position j·K + i (segment cells; −1 for start states). */
  exceptionColumns: Int32Array | null;
  exceptionColumnCells: Int32Array | null;
  /** Per state j, the states i with i → j inside a segment: insideRows[insideOffsets[j]..insideOffsets[j+1]). */
  insideOffsets: Int32Array;
  insideRows: Int32Array;
  /**
   * Inside-segment contexts (previous symbol) seen followed by a symbol: (previous, symbol) →
   * group q, whose states and exact log ratios are pairStates/pairRatios[pairStarts[q]..pairStarts[q+1]).
   */
  pairIndex: PairTable | null;
  pairStarts: Int32Array | null;
  pairStates: Int32Array | null;
  pairRatios: Float64Array | null;
  /**
   * Per pair entry y (state j): its inside-segment cells' step scores (one per state i with
   * i → j inside a segment, in insideRows order) at pairCellLog/pairCellExp[pairCells[y]..pairCells[y+1]),
   * computed the first time the pair's step is patched (pairReady[q] = 1): they depend on the
   * pair only.
   */
  pairCells: Int32Array | null;
  pairCellLog: Float64Array | null;
  pairCellExp: Float64Array | null;
  pairReady: Uint8Array | null;
  /** Context-free parts: segment-start cells' log(u/(n+u)) (0 without a row), and the start's. */
  segmentZero: Float64Array;
  startZero: Float64Array;
  /** K end probabilities, or null. */
  end: Float64Array | null;
  keep: Float64Array;
  lattice: SentenceLattice;
  /** The IOB2 mask while every matrix built so far is −Infinity at its forbidden cells, else null. */
  allowed: Uint8Array | null;
  /**
   * Sum of the numbers read ahead of use (see buildSentenceLattice), kept so that the reads are
   * not dropped as dead code; never read for a score.
   */
  sink: number;
  /** The model's suffix statistics as a trie, or null without suffix statistics. */
  suffix: SuffixTrie | null;
  conditional: Float64Array;
};

const caches = new WeakMap<TaggerModel, Cache>();

/** Whether {@link buildSentenceLattice} handles this model. */
export function fastLatticeApplies(model: TaggerModel): boolean {
  const { config } = model;
  return model.nltk === null && config.order === 1 && model.statistics.buckets === 1 && config.positionBuckets.sentence.length === 0;
}

function createLattice(K: number, capacity: number): SentenceLattice {
  return {
    length: 0,
    symbols: new Int32Array(capacity),
    logStart: new Float64Array(K),
    start: new Float64Array(K),
    logSteps: new Float64Array(0),
    steps: new Float64Array(0),
    logEmissions: new Float64Array(capacity * K),
    emissions: new Float64Array(capacity * K),
    end: null,
    columns: new Int32Array(capacity * K),
    allowed: null,
    rows: new Int32Array(capacity),
    hashes: new Int32Array(capacity),
    scaled: createScaledWorkspace(K, capacity),
    viterbi: createViterbiWorkspace(K, capacity),
    path: new Int32Array(capacity),
  };
}

function createCache(model: TaggerModel): Cache {
  const K = model.tags.length;
  const KK = K * K;
  const S = model.statistics.symbols;
  const { parameters } = model;
  const end = parameters.end === null ? null : Float64Array.from(parameters.end, Math.exp);
  const keep = new Float64Array(K);
  if (parameters.end !== null) for (let i = 0; i < K; i++) keep[i] = Math.log1p(-Math.exp(parameters.end[i]));
  const segmentZero = new Float64Array(KK);
  const startZero = new Float64Array(K);
  let exceptionOffsets: Int32Array | null = null;
  let exceptionCells: Int32Array | null = null;
  let exceptionRatios: Float64Array | null = null;
  let exceptionColumns: Int32Array | null = null;
  let exceptionColumnCells: Int32Array | null = null;
  const insideOffsets = new Int32Array(K + 1);
  const inside: number[] = [];
  if (model.segmentStarts !== null) {
    for (let j = 0; j < K; j++) {
      for (let i = 0; i < K; i++) if (model.segmentStarts[i * K + j] !== 1) inside.push(i);
      insideOffsets[j + 1] = inside.length;
    }
  }
  const insideRows = Int32Array.from(inside);
  let pairIndex: PairTable | null = null;
  let pairStartsOut: Int32Array | null = null;
  let pairStates: Int32Array | null = null;
  let pairRatios: Float64Array | null = null;
  let pairCells: Int32Array | null = null;
  let pairReady: Uint8Array | null = null;
  let exceptionLog: Float64Array | null = null;
  let exceptionExp: Float64Array | null = null;
  const pairSymbols = new Uint8Array(S);
  const pairFilter = new Uint32Array(PAIR_FILTER_WORDS);
  const table = parameters.contextEmission;
  if (table !== null && model.segmentStarts !== null) {
    // For a context never seen with the current word, contextEmissionLogRatio is log(u/(n+u)).
    const zero = (context: number, j: number): number => {
      const entry = findEntry(table.totals, context * K + j);
      if (entry < 0) return 0;
      const n = table.totals.values[entry];
      const u = table.distinct.values[entry];
      return Math.log((0 + u) / (n + u));
    };
    for (let i = 0; i < K; i++) for (let j = 0; j < K; j++) segmentZero[i * K + j] = model.segmentStarts[i * K + j] === 1 ? zero(i, j) : 0;
    for (let j = 0; j < K; j++) startZero[j] = zero(K, j);
    // Cells (context ≤ K, state) by symbol, for the words that have a count there; only cells
    // where that context applies (segment starts, and the sentence start).
    const { counts } = table;
    const applies = (key: number): boolean => {
      const row = Math.floor(key / S);
      const context = Math.floor(row / K);
      if (context > K) return false;
      return context === K || model.segmentStarts![context * K + (row % K)] === 1;
    };
    const sizes = new Int32Array(S + 1);
    for (let e = 0; e < counts.size; e++) if (applies(counts.keys[e])) sizes[(counts.keys[e] % S) + 1]++;
    exceptionOffsets = new Int32Array(S + 1);
    for (let s = 0; s < S; s++) exceptionOffsets[s + 1] = exceptionOffsets[s] + sizes[s + 1];
    exceptionCells = new Int32Array(exceptionOffsets[S]);
    exceptionRatios = new Float64Array(exceptionOffsets[S]);
    exceptionColumns = new Int32Array(exceptionOffsets[S]);
    exceptionColumnCells = new Int32Array(exceptionOffsets[S]);
    const fill = exceptionOffsets.slice(0, S);
    // Inside-segment contexts: group the entries by (previous symbol, symbol).
    pairIndex = createPairTable();
    const pairSizes: number[] = [];
    // Segment cells first, then the start cells (context K), within each symbol's list.
    for (const startCells of [false, true]) {
      for (let e = 0; e < counts.size; e++) {
        const key = counts.keys[e];
        if (!applies(key)) continue;
        const symbol = key % S;
        const row = (key - symbol) / S;
        const context = Math.floor(row / K);
        if ((context === K) !== startCells) continue;
        const j = row % K;
        const x = fill[symbol]++;
        exceptionCells[x] = context === K ? KK + j : context * K + j;
        exceptionColumns[x] = context === K ? -1 : j;
        exceptionColumnCells[x] = context === K ? -1 : j * K + context;
        exceptionRatios[x] = contextEmissionLogRatio(table, S, K, context, j, symbol, parameters.emissions[symbol * K + j]);
      }
    }
    for (let e = 0; e < counts.size; e++) {
      const key = counts.keys[e];
      const symbol = key % S;
      const row = (key - symbol) / S;
      const context = Math.floor(row / K);
      if (context > K) {
        pairSymbols[symbol] = 1;
        addToFilter(pairFilter, context - K - 1, symbol);
        const found = getPair(pairIndex, context - K - 1, symbol, -1);
        if (found < 0) {
          setPair(pairIndex, context - K - 1, symbol, pairSizes.length);
          pairSizes.push(1);
        } else pairSizes[found]++;
      }
    }
    const pairStarts = new Int32Array(pairSizes.length + 1);
    for (let q = 0; q < pairSizes.length; q++) pairStarts[q + 1] = pairStarts[q] + pairSizes[q];
    pairStates = new Int32Array(pairStarts[pairSizes.length]);
    pairRatios = new Float64Array(pairStarts[pairSizes.length]);
    const pairFill = pairStarts.slice(0, pairSizes.length);
    for (let e = 0; e < counts.size; e++) {
      const key = counts.keys[e];
      const symbol = key % S;
      const row = (key - symbol) / S;
      const context = Math.floor(row / K);
      if (context <= K) continue;
      const j = row % K;
      const q = getPair(pairIndex, context - K - 1, symbol, -1);
      const x = pairFill[q]++;
      pairStates[x] = j;
      pairRatios[x] = contextEmissionLogRatio(table, S, K, context, j, symbol, parameters.emissions[symbol * K + j]);
    }
    pairStartsOut = pairStarts;
    pairCells = new Int32Array(pairStates.length + 1);
    for (let y = 0; y < pairStates.length; y++) pairCells[y + 1] = pairCells[y] + insideOffsets[pairStates[y] + 1] - insideOffsets[pairStates[y]];
    pairReady = new Uint8Array(pairSizes.length);
    exceptionLog = new Float64Array(exceptionCells.length);
    exceptionExp = new Float64Array(exceptionCells.length);
    for (let x = 0; x < exceptionCells.length; x++) {
      if (exceptionCells[x] >= KK) continue;
      exceptionLog[x] = parameters.transitions[exceptionCells[x]] + exceptionRatios[x];
      exceptionExp[x] = Math.exp(exceptionLog[x]);
    }
  }
  // The forbidden cells stay −Infinity under a patch when its ratio is finite (−∞ + r = −∞).
  const mask = model.constraints?.allowed ?? null;
  let valid = mask !== null;
  if (mask !== null) {
    for (let x = 0; x < KK; x++) if (mask[x] === 0 && parameters.transitions[x] !== -Infinity) valid = false;
    if (exceptionCells !== null) {
      for (let x = 0; x < exceptionCells.length; x++) if (exceptionCells[x] < KK && mask[exceptionCells[x]] === 0 && !Number.isFinite(exceptionRatios![x])) valid = false;
    }
    if (pairRatios !== null) for (let y = 0; y < pairRatios.length; y++) if (!Number.isFinite(pairRatios[y])) valid = false;
  }
  const initialPool = Math.min(INITIAL_POOL_PLACES, poolSizeFor(K));
  return {
    K,
    allowed: valid ? mask : null,
    // Room for about as many word types as the vocabulary has symbols before the first growth.
    words: createWordTable(Math.min(MAX_WORD_ENTRIES, Math.max(1024, 2 * S))),
    known: knownWords(model.vocabulary),
    wordRows: new Float64Array(Math.min(MAX_WORD_ENTRIES, Math.max(1024, S)) * (2 * K + 1)),
    rowCount: 0,
    symbolRows: new Int32Array(S).fill(-1),
    suffixRows: createPairTable(),
    previousSlot: new Int32Array(S).fill(-1),
    previousBase: new Float64Array(64 * KK),
    previousLog: new Float64Array((1 + initialPool + 128) * KK),
    previousExp: new Float64Array((1 + initialPool + 128) * KK),
    patches: 1 + initialPool + 64,
    poolKeys: new Int32Array(4 * initialPool),
    poolColumns: new Uint8Array(K * initialPool),
    columnMark: new Int32Array(K),
    patchCount: 0,
    poolSize: initialPool,
    poolPlaced: 0,
    sentence: 0,
    pairSymbols,
    pairFilter,
    previousHasRow: new Uint8Array(64 * K),
    previousAnyRow: new Uint8Array(64),
    previousOwnRow: new Uint8Array(64 * K),
    previousCount: 0,
    exceptionOffsets,
    exceptionCells,
    exceptionRatios,
    exceptionColumns,
    exceptionColumnCells,
    insideOffsets,
    insideRows,
    pairIndex,
    pairStarts: pairStartsOut,
    pairStates,
    pairRatios,
    pairCells,
    pairCellLog: pairCells === null ? null : new Float64Array(pairCells[pairCells.length - 1]),
    pairCellExp: pairCells === null ? null : new Float64Array(pairCells[pairCells.length - 1]),
    pairReady,
    exceptionLog,
    exceptionExp,
    segmentZero,
    startZero,
    end,
    keep,
    lattice: createLattice(K, 64),
    sink: 0,
    suffix: model.suffix === null ? null : createSuffixTrie(model.suffix),
    conditional: new Float64Array(K),
  };
}

function knownWords(vocabulary: Vocabulary): WordTable {
  const table = createWordTable(Math.max(1024, vocabulary.index.size));
  for (const [word, id] of vocabulary.index) insertHashedWord(table, word, false, id, hashWord(word, false));
  return table;
}

/**
 * symbolOf (estimation/vocabulary.ts) through the cache's typed table of known words:
 * `plainHash` is hashWord(word, false).
 */
function symbolOfHashed(vocabulary: Vocabulary, known: WordTable, word: string, first: boolean, plainHash: number): number {
  const id = findHashedWord(known, word, false, plainHash);
  if (id >= 0) return id;
  if (first && vocabulary.lowercaseFirstWord) {
    const lower = word.charAt(0).toLowerCase() + word.slice(1);
    const found = findHashedWord(known, lower, false, hashWord(lower, false));
    if (found >= 0) return found;
  }
  return vocabulary.words.length + classOf(vocabulary, word, first);
}

function cacheOf(model: TaggerModel): Cache {
  let cache = caches.get(model);
  if (cache === undefined) {
    cache = createCache(model);
    caches.set(model, cache);
  }
  return cache;
}

function grow<T extends Float64Array | Int32Array | Uint8Array>(array: T, size: number): T {
  if (array.length >= size) return array;
  const next = new (array.constructor as new (n: number) => T)(Math.max(size, array.length * 2));
  next.set(array);
  return next;
}

/**
 * Emission row of a word type at a sentence position, filling it on first sight: the word's
 * symbol and its scores (the table row, plus the suffix log-ratio for unknown words), log and exp.
 */
function wordEntry(model: TaggerModel, cache: Cache, word: string, first: boolean, hash: number): number {
  const found = findHashedWord(cache.words, word, first, hash);
  if (found >= 0) return found;
  const K = cache.K;
  const symbol = symbolOfHashed(model.vocabulary, cache.known, word, first, first ? hashWord(word, false) : hash);
  let suffix = -1;
  let group = -1;
  if (symbol >= model.vocabulary.words.length && cache.suffix !== null) {
    // An unknown word's symbol is V + its class, and its suffix group that class (suffixGroupOf),
    // so the class tests run once; without classes the group is its capitalisation.
    group = model.vocabulary.scheme === "none" ? suffixGroupOf(model.vocabulary, word, first) : symbol - model.vocabulary.words.length;
    suffix = suffixNode(cache.suffix, word, group);
  }
  // A word the clustering knows adds its cluster's ratio (cluster-emissions.ts), and with
  // word-type feature weights every word adds its own (emission-adjustments.ts): such rows are their own.
  const clustered = emissionRowIsOwn(model, word, symbol);
  let row = clustered ? -1 : suffix < 0 ? cache.symbolRows[symbol] : getPair(cache.suffixRows, symbol, suffix, -1);
  if (row < 0) {
    const W = 2 * K + 1;
    row = cache.rowCount++;
    cache.wordRows = grow(cache.wordRows, (row + 1) * W);
    const rows = cache.wordRows;
    rows[row * W] = symbol;
    const { emissions } = model.parameters;
    const out = row * W + 1;
    for (let k = 0; k < K; k++) rows[out + k] = emissions[symbol * K + k];
    if (suffix >= 0) {
      addNodeLogRatio(cache.suffix!, group, suffix, rows, out);
    }
    // The perceptron's weights depend on the symbol only, so rows stay shared with them.
    addEmissionAdjustments(model, word, first, symbol, rows, out);
    if (!clustered) {
      if (suffix >= 0) setPair(cache.suffixRows, symbol, suffix, row);
      else cache.symbolRows[symbol] = row;
    }
    for (let k = 0; k < K; k++) rows[out + K + k] = Math.exp(rows[out + k]);
  }
  insertHashedWord(cache.words, word, first, row, hash);
  return row;
}

/** Slot of the K×K step matrix after previous symbol `previous` (context-free parts folded in). */
function previousEntry(model: TaggerModel, cache: Cache, previous: number): number {
  const slot = cache.previousSlot[previous];
  if (slot >= 0) return slot;
  const K = cache.K;
  const KK = K * K;
  const entry = cache.previousCount++;
  cache.previousBase = grow(cache.previousBase, (entry + 1) * KK);
  cache.previousLog = grow(cache.previousLog, (cache.patches + entry + 1) * KK);
  cache.previousExp = grow(cache.previousExp, (cache.patches + entry + 1) * KK);
  cache.previousHasRow = grow(cache.previousHasRow, (entry + 1) * K);
  cache.previousOwnRow = grow(cache.previousOwnRow, (entry + 1) * K);
  cache.previousAnyRow = grow(cache.previousAnyRow, entry + 1);
  cache.previousAnyRow[entry] = 0;
  const { parameters } = model;
  const base = parameters.transitions;
  const table = parameters.prevWord;
  const contextTable = parameters.contextEmission;
  const segmentStarts = model.segmentStarts;
  const allowed = model.constraints?.allowed ?? null;
  const logs = cache.previousBase;
  const conditional = cache.conditional;
  const keep = cache.keep;
  const out0 = entry * KK;
  // The same arithmetic, in the same order, as buildFirstOrderProblem (decode-input.ts).
  for (let i = 0; i < K; i++) {
    const out = out0 + i * K;
    const row = table === null ? -1 : prevWordRow(table, previous * K + i);
    cache.previousOwnRow[entry * K + i] = row < 0 ? 0 : 1;
    if (table === null || row < 0) {
      for (let j = 0; j < K; j++) logs[out + j] = base[i * K + j];
    } else {
      for (let j = 0; j < K; j++) conditional[j] = base[i * K + j] - keep[i];
      interpolateWittenBell(table.entries, table.values, table.offsets[row], table.offsets[row + 1], conditional, 0, K, logs, out);
      for (let j = 0; j < K; j++) logs[out + j] += keep[i];
      if (allowed !== null) for (let j = 0; j < K; j++) if (allowed[i * K + j] === 0) logs[out + j] = -Infinity;
    }
  }
  const folded = cache.previousLog;
  const at = (cache.patches + entry) * KK;
  // Column-major: cell (i, j) at j·K + i.
  for (let i = 0; i < K; i++) for (let j = 0; j < K; j++) folded[at + j * K + i] = logs[out0 + i * K + j];
  const hasRow = cache.previousHasRow;
  hasRow.fill(0, entry * K, entry * K + K);
  if (contextTable !== null && segmentStarts !== null) {
    const contextRow = (K + 1 + previous) * K;
    for (let j = 0; j < K; j++) {
      const found = findEntry(contextTable.totals, contextRow + j);
      let wordZero = 0;
      if (found >= 0) {
        hasRow[entry * K + j] = 1;
        cache.previousAnyRow[entry] = 1;
        const n = contextTable.totals.values[found];
        const u = contextTable.distinct.values[found];
        wordZero = Math.log((0 + u) / (n + u));
      }
      for (let i = 0; i < K; i++) folded[at + j * K + i] += segmentStarts[i * K + j] === 1 ? cache.segmentZero[i * K + j] : wordZero;
    }
  }
  for (let x = 0; x < KK; x++) cache.previousExp[at + x] = Math.exp(folded[at + x]);
  const mask = cache.allowed;
  if (mask !== null) {
    for (let i = 0; i < K; i++) for (let j = 0; j < K; j++) if (mask[i * K + j] === 0 && folded[at + j * K + i] !== -Infinity) cache.allowed = null;
  }
  cache.previousSlot[previous] = entry;
  return entry;
}

/** Words of the pair filter: 2^20 bits, 128 KiB. */
const PAIR_FILTER_WORDS = 1 << 15;

function firstHash(previous: number, symbol: number): number {
  let h = Math.imul(previous ^ 0x27d4eb2d, 0x85ebca6b) ^ Math.imul(symbol, 0xcc9e2d51);
  h ^= h >>> 16;
  h = Math.imul(h, 0x7feb352d);
  return h ^ (h >>> 15);
}

function secondHash(first: number): number {
  const g = Math.imul(first ^ 0x165667b1, 0x846ca68b);
  return g ^ (g >>> 16);
}

function addToFilter(filter: Uint32Array, previous: number, symbol: number): void {
  const h = firstHash(previous, symbol);
  const a = h >>> 12;
  const b = secondHash(h) >>> 12;
  filter[a >>> 5] |= 1 << (a & 31);
  filter[b >>> 5] |= 1 << (b & 31);
}

function inFilter(filter: Uint32Array, previous: number, symbol: number): boolean {
  const h = firstHash(previous, symbol);
  const a = h >>> 12;
  if ((filter[a >>> 5] & (1 << (a & 31))) === 0) return false;
  const b = secondHash(h) >>> 12;
  return (filter[b >>> 5] & (1 << (b & 31))) !== 0;
}

/** The pool place of a (previous symbol, symbol) pair. */
function poolPlace(previous: number, symbol: number, mask: number): number {
  let h = Math.imul(previous, 0x9e3779b1) ^ Math.imul(symbol ^ 0x5bd1e995, 0x85ebca6b);
  h ^= h >>> 15;
  h = Math.imul(h, 0x2c1b3c6d);
  h ^= h >>> 13;
  return h & mask;
}

function setPlace(keys: Int32Array, place: number, previous: number, symbol: number, matrix: number, sentence: number): void {
  keys[place] = previous + 1;
  keys[place + 1] = symbol;
  keys[place + 2] = matrix;
  keys[place + 3] = sentence;
}

/** Makes room for `length` matrices before the slots, keeping the pool's and moving the slots behind. */
function reservePatches(cache: Cache, length: number): void {
  if (cache.patches >= length) return;
  const KK = cache.K * cache.K;
  // The sentence area doubles; the pool's matrices stay as they are.
  const pool = 1 + cache.poolSize;
  const patches = Math.max(length, pool + 2 * (cache.patches - pool));
  const size = (patches + Math.max(cache.previousCount, 64)) * KK;
  const log = new Float64Array(size);
  const exp = new Float64Array(size);
  log.set(cache.previousLog.subarray(0, (1 + cache.poolSize) * KK));
  exp.set(cache.previousExp.subarray(0, (1 + cache.poolSize) * KK));
  log.set(cache.previousLog.subarray(cache.patches * KK, (cache.patches + cache.previousCount) * KK), patches * KK);
  exp.set(cache.previousExp.subarray(cache.patches * KK, (cache.patches + cache.previousCount) * KK), patches * KK);
  cache.previousLog = log;
  cache.previousExp = exp;
  cache.patches = patches;
}

/**
 * Enlarges the pool to `size` places (between sentences): its places start empty, matrix 0
 * stays, the sentence area and the slots move behind the larger pool.
 */
function growPool(cache: Cache, size: number): void {
  const KK = cache.K * cache.K;
  const area = cache.patches - 1 - cache.poolSize;
  const patches = 1 + size + area;
  const length = (patches + Math.max(cache.previousCount, 64)) * KK;
  const log = new Float64Array(length);
  const exp = new Float64Array(length);
  log.set(cache.previousLog.subarray(0, KK));
  exp.set(cache.previousExp.subarray(0, KK));
  log.set(cache.previousLog.subarray(cache.patches * KK, (cache.patches + cache.previousCount) * KK), patches * KK);
  exp.set(cache.previousExp.subarray(cache.patches * KK, (cache.patches + cache.previousCount) * KK), patches * KK);
  cache.previousLog = log;
  cache.previousExp = exp;
  cache.patches = patches;
  cache.poolSize = size;
  cache.poolKeys = new Int32Array(4 * size);
  cache.poolColumns = new Uint8Array(cache.K * size);
  cache.poolPlaced = 0;
}

/** Copies one column (K numbers) of the log and the probability matrices. */
function copyColumn(logs: Float64Array, exps: Float64Array, from: number, to: number, K: number): void {
  for (let i = 0; i < K; i++) {
    logs[to + i] = logs[from + i];
    exps[to + i] = exps[from + i];
  }
}

/**
 * Builds the lattice of one sentence into the model's reused buffers (valid until the next call
 * for the same model). Expects {@link fastLatticeApplies}(model) and a non-empty sentence.
 */
export function buildSentenceLattice(model: TaggerModel, words: readonly string[]): SentenceLattice {
  const cache = cacheOf(model);
  const K = cache.K;
  const KK = K * K;
  const T = words.length;
  let lattice = cache.lattice;
  if (lattice.symbols.length < T) {
    lattice = createLattice(K, Math.max(T, 2 * lattice.symbols.length));
    cache.lattice = lattice;
  }
  lattice.length = T;
  lattice.end = cache.end;
  const { symbols, logEmissions, emissions, logStart, start } = lattice;
  // Start afresh between sentences only (this one's tokens then all find their rows), at most
  // T words and rows later.
  if (cache.words.size + T > MAX_WORD_ENTRIES || cache.rowCount + T > MAX_WORD_ENTRIES) {
    clearWords(cache.words);
    cache.rowCount = 0;
    cache.symbolRows.fill(-1);
    clearPairs(cache.suffixRows);
  }
  // Several passes, so that the memory reads of one token's lookup and of the next token's
  // overlap: the hashes and each token's first table slot in a loop of independent loads, then
  // the lookups (whose slots are on their way to the cache by then).
  const entries = lattice.rows;
  const hashes = lattice.hashes;
  let ahead = 0;
  for (let t = 0; t < T; t++) {
    const h = hashWord(words[t], t === 0);
    hashes[t] = h;
    ahead += firstProbe(cache.words, h);
  }
  for (let t = 0; t < T; t++) entries[t] = wordEntry(model, cache, words[t], t === 0, hashes[t]);
  const rows = cache.wordRows;
  const W = 2 * K + 1;
  // Symbols first: a loop of independent loads (one per cache line of each row), so the rows'
  // cache misses overlap.
  let touched = 0;
  for (let t = 0; t < T; t++) {
    const at = entries[t] * W;
    symbols[t] = rows[at];
    for (let x = at + 8; x < at + W; x += 8) touched += rows[x];
    touched += rows[at + W - 1];
  }
  cache.sink = ahead + touched;
  for (let t = 0; t < T; t++) {
    const at = entries[t] * W;
    for (let k = 0, from = at + 1, to = t * K; k < K; k++) {
      logEmissions[to + k] = rows[from + k];
      emissions[to + k] = rows[from + K + k];
    }
  }
  // Per-token additions (neighbour features) on top of the cached per-word-type rows.
  addTokenAdjustments(model, words, logEmissions, emissions);
  const { parameters } = model;
  const contextTable = parameters.contextEmission;
  const segmentStarts = model.segmentStarts;
  const withContext = contextTable !== null && segmentStarts !== null;
  const offsets = cache.exceptionOffsets!;
  const cells = cache.exceptionCells!;
  const ratios = cache.exceptionRatios!;
  // Sentence start: the start distribution plus the context ratio for context K (sentence start).
  const s0 = symbols[0];
  for (let j = 0; j < K; j++) logStart[j] = parameters.start[j];
  if (withContext) {
    for (let j = 0; j < K; j++) logStart[j] += cache.startZero[j];
    for (let x = offsets[s0]; x < offsets[s0 + 1]; x++) {
      const cell = cells[x];
      if (cell >= KK) logStart[cell - KK] = parameters.start[cell - KK] + ratios[x];
    }
  }
  for (let j = 0; j < K; j++) start[j] = Math.exp(logStart[j]);
  lattice.allowed = cache.allowed;
  if (T < 2) return lattice;
  if (cache.poolPlaced >= cache.poolSize && cache.poolSize < poolSizeFor(K)) growPool(cache, poolSizeFor(K));
  // Room for this sentence's own patched steps; a new sentence number frees the pool's places.
  reservePatches(cache, 1 + cache.poolSize + T);
  if (++cache.sentence >= 0x3fffffff) {
    cache.poolKeys.fill(0);
    cache.sentence = 1;
  }
  const poolKeys = cache.poolKeys;
  const poolMask = cache.poolSize - 1;
  // Start afresh between sentences only: the steps of this one point into the slots.
  if (cache.previousCount + T > previousLimit(K)) {
    cache.previousSlot.fill(-1);
    cache.previousCount = 0;
  }
  const columns = lattice.columns;
  if (parameters.prevWord === null && !withContext) {
    // One matrix for every step: the base transitions, in patch matrix 0 (column-major).
    for (let i = 0; i < K; i++) {
      for (let j = 0; j < K; j++) {
        cache.previousLog[j * K + i] = parameters.transitions[i * K + j];
        cache.previousExp[j * K + i] = Math.exp(parameters.transitions[i * K + j]);
      }
    }
    lattice.logSteps = cache.previousLog;
    lattice.steps = cache.previousExp;
    lattice.allowed = cache.allowed;
    for (let t = 1; t < T; t++) for (let j = 0, c = t * K; j < K; j++) columns[c + j] = j * K;
    return lattice;
  }
  const poolColumns = cache.poolColumns;
  const mark = cache.columnMark;
  const insideOffsets = cache.insideOffsets;
  const insideRows = cache.insideRows;
  const columnCells = cache.exceptionColumnCells!;
  const exceptionColumns = cache.exceptionColumns!;
  const exceptionLog = cache.exceptionLog!;
  const exceptionExp = cache.exceptionExp!;
  for (let t = 1; t < T; t++) {
    const previous = symbols[t - 1];
    const slot = previousEntry(model, cache, previous);
    const matrix = (cache.patches + slot) * KK;
    const at = t * K;
    if (withContext) {
      const symbol = symbols[t];
      const first = offsets[symbol];
      const last = offsets[symbol + 1];
      // Start cells come last in a symbol's list (cell ≥ K²), so a first cell < K² means segment cells.
      const hasSegmentCells = first < last && cells[first] < KK;
      const maybePair = cache.previousAnyRow[slot] !== 0 && cache.pairSymbols[symbol] !== 0 && inFilter(cache.pairFilter, previous, symbol);
      if (hasSegmentCells || maybePair) {
        const place = 4 * poolPlace(previous, symbol, poolMask);
        const h = place >> 2;
        if (poolKeys[place] === previous + 1 && poolKeys[place + 1] === symbol) {
          const pooled = poolKeys[place + 2];
          if (pooled > 0) {
            // This sentence reads the matrix now: keep the place until the next sentence.
            poolKeys[place + 3] = cache.sentence;
            const own = pooled * KK;
            for (let j = 0, f = h * K; j < K; j++) columns[at + j] = (poolColumns[f + j] !== 0 ? own : matrix) + j * K;
            continue;
          }
        } else {
          // The place is free unless this sentence reads its matrix.
          const free = poolKeys[place + 2] === 0 || poolKeys[place + 3] !== cache.sentence;
          const q = maybePair ? getPair(cache.pairIndex!, previous, symbol, -1) : -1;
          if (hasSegmentCells || q >= 0) {
            // This word overrides cells: the columns it touches are copied from the slot's matrix
            // into the pair's pool matrix (or this step's own matrix when the place is taken) and
            // patched there; the step reads its other columns from the slot's matrix.
            const patched = free ? 1 + h : 1 + cache.poolSize + t;
            const out = patched * KK;
            const stamp = ++cache.patchCount;
            const logs = cache.previousLog;
            const exps = cache.previousExp;
            const base = cache.previousBase;
            const from = slot * KK;
            let touched = 0;
            // Re-read after previousEntry, which may have grown the array.
            const ownRows = cache.previousOwnRow;
            const ownRow = slot * K;
            // Segment-start cells where this word was seen after state i (exact ratio precomputed,
            // and the whole score too unless the previous word has its own row i).
            for (let x = first; x < last; x++) {
              const cell = cells[x];
              if (cell >= KK) continue;
              const c = columnCells[x];
              const j = exceptionColumns[x];
              if (mark[j] !== stamp) {
                mark[j] = stamp;
                touched++;
                copyColumn(logs, exps, matrix + j * K, out + j * K, K);
              }
              if (ownRows[ownRow + c - j * K] === 0) {
                logs[out + c] = exceptionLog[x];
                exps[out + c] = exceptionExp[x];
              } else {
                const v = base[from + cell] + ratios[x];
                logs[out + c] = v;
                exps[out + c] = Math.exp(v);
              }
            }
            // Inside-segment cells whose context (the previous word) was seen followed by this word.
            if (q >= 0) {
              const pairStates = cache.pairStates!;
              const pairCells = cache.pairCells!;
              const pairLog = cache.pairCellLog!;
              const pairExp = cache.pairCellExp!;
              const y0 = cache.pairStarts![q];
              const y1 = cache.pairStarts![q + 1];
              if (cache.pairReady![q] === 0) {
                cache.pairReady![q] = 1;
                const pairRatios = cache.pairRatios!;
                for (let y = y0; y < y1; y++) {
                  const j = pairStates[y];
                  for (let r = insideOffsets[j], z = pairCells[y]; r < insideOffsets[j + 1]; r++, z++) {
                    const v = base[from + insideRows[r] * K + j] + pairRatios[y];
                    pairLog[z] = v;
                    pairExp[z] = Math.exp(v);
                  }
                }
              }
              for (let y = y0; y < y1; y++) {
                const j = pairStates[y];
                const r0 = insideOffsets[j];
                const r1 = insideOffsets[j + 1];
                if (r0 === r1) continue;
                if (mark[j] !== stamp) {
                  mark[j] = stamp;
                  touched++;
                  copyColumn(logs, exps, matrix + j * K, out + j * K, K);
                }
                for (let r = r0, z = pairCells[y]; r < r1; r++, z++) {
                  const i = insideRows[r];
                  logs[out + j * K + i] = pairLog[z];
                  exps[out + j * K + i] = pairExp[z];
                }
              }
            }
            if (touched > 0) {
              if (free) {
                setPlace(poolKeys, place, previous, symbol, patched, cache.sentence);
                cache.poolPlaced++;
                for (let j = 0, f = h * K; j < K; j++) poolColumns[f + j] = mark[j] === stamp ? 1 : 0;
              }
              for (let j = 0; j < K; j++) columns[at + j] = (mark[j] === stamp ? out : matrix) + j * K;
              continue;
            }
          }
          // The pair overrides no cell: remember that, and the slot's matrix serves.
          if (free) {
            setPlace(poolKeys, place, previous, symbol, 0, cache.sentence);
            cache.poolPlaced++;
          }
        }
      }
    }
    for (let j = 0; j < K; j++) columns[at + j] = matrix + j * K;
  }
  lattice.logSteps = cache.previousLog;
  lattice.steps = cache.previousExp;
  lattice.allowed = cache.allowed;
  return lattice;
}

