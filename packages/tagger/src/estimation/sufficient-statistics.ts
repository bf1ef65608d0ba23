import { addCount, cloneCountTable, createCountTable, type CountTable } from "./count-table";

/**
 * Sufficient statistics of the tagger: additive counts from which every parameter is estimated.
 * Counts from labelled data, expected counts from EM and sampled counts all have this shape, so
 * shards of a large corpus can be counted separately and summed (DESIGN.md, "Scale").
 */
export type SufficientStatistics = {
  /** K states. */
  readonly states: number;
  /** S symbols (known words + word classes). */
  readonly symbols: number;
  /** B transition buckets and SB sentence buckets (position-aware transitions). */
  readonly buckets: number;
  readonly sentenceBuckets: number;
  /** SB×K: first states, per sentence bucket. */
  readonly start: Float64Array;
  /** B×K×K: transitions into tokens of each bucket, [bucket][from][to]. */
  readonly transitions: Float64Array;
  /** K: last states (sentence ends). */
  readonly end: Float64Array;
  /** S×K: (symbol, state) pairs. */
  readonly emissions: Float64Array;
  /** ((previous symbol·K + from)·K + to) → count, for previous-word transitions; null when off. */
  readonly prevWord: CountTable | null;
  /**
   * ((x·(K+1) + y)·(K+1) + z) → count of state triples over each sentence padded as
   * BOS BOS s_0 … s_{T-1} [EOS], boundary index K; null when the model is first-order.
   */
  readonly trigrams: CountTable | null;
  /** ((context·K + state)·S + symbol) → count for context-conditioned emissions (context-emissions.ts); null when off. */
  readonly contextEmissions: CountTable | null;
  /** Tokens and sentences counted (weighted). */
  tokens: number;
  sentences: number;
};

/** Zero statistics of the given shape. */
export function createSufficientStatistics(shape: {
  states: number;
  symbols: number;
  buckets: number;
  sentenceBuckets: number;
  prevWord: boolean;
  trigrams: boolean;
  contextEmissions: boolean;
}): SufficientStatistics {
  const { states: K, symbols: S, buckets: B, sentenceBuckets: SB } = shape;
  for (const [name, v] of Object.entries({ states: K, symbols: S, buckets: B, sentenceBuckets: SB })) {
    if (!Number.isInteger(v) || v < 1) throw new RangeError(`statistics ${name} must be a positive integer, got ${v}`);
  }
  return {
    states: K,
    symbols: S,
    buckets: B,
    sentenceBuckets: SB,
    start: new Float64Array(SB * K),
    transitions: new Float64Array(B * K * K),
    end: new Float64Array(K),
    emissions: new Float64Array(S * K),
    prevWord: shape.prevWord ? createCountTable() : null,
    trigrams: shape.trigrams ? createCountTable() : null,
    contextEmissions: shape.contextEmissions ? createCountTable() : null,
    tokens: 0,
    sentences: 0,
  };
}

/** A new object holding a + weight·b (shapes must agree); inputs are not modified. */
export function addStatistics(a: SufficientStatistics, b: SufficientStatistics, weight = 1): SufficientStatistics {
  if (a.states !== b.states || a.symbols !== b.symbols || a.buckets !== b.buckets || a.sentenceBuckets !== b.sentenceBuckets) {
    throw new RangeError(
      `addStatistics: shapes differ (K ${a.states}/${b.states}, S ${a.symbols}/${b.symbols}, B ${a.buckets}/${b.buckets}, SB ${a.sentenceBuckets}/${b.sentenceBuckets})`,
    );
  }
  if ((a.prevWord === null) !== (b.prevWord === null) || (a.trigrams === null) !== (b.trigrams === null) || (a.contextEmissions === null) !== (b.contextEmissions === null)) {
    throw new RangeError("addStatistics: one side has previous-word, trigram or context-emission counts and the other does not");
  }
  const dense = (x: Float64Array, y: Float64Array) => {
    const out = x.slice();
    for (let i = 0; i < out.length; i++) out[i] += weight * y[i];
    return out;
  };
  const sparse = (x: CountTable | null, y: CountTable | null) => {
    if (x === null || y === null) return null;
    const out = cloneCountTable(x);
    for (let e = 0; e < y.size; e++) addCount(out, y.keys[e], weight * y.values[e]);
    return out;
  };
  return {
    states: a.states,
    symbols: a.symbols,
    buckets: a.buckets,
    sentenceBuckets: a.sentenceBuckets,
    start: dense(a.start, b.start),
    transitions: dense(a.transitions, b.transitions),
    end: dense(a.end, b.end),
    emissions: dense(a.emissions, b.emissions),
    prevWord: sparse(a.prevWord, b.prevWord),
    trigrams: sparse(a.trigrams, b.trigrams),
    contextEmissions: sparse(a.contextEmissions, b.contextEmissions),
    tokens: a.tokens + weight * b.tokens,
    sentences: a.sentences + weight * b.sentences,
  };
}

/** Non-zero cells and their approximate storage (8 bytes per dense cell, 16 per sparse entry). */
export function statisticsSize(stats: SufficientStatistics, representation: "dense" | "sparse"): { cells: number; bytes: number } {
  let cells = 0;
  let denseCells = 0;
  const nonZero = (table: CountTable | null) => {
    let n = 0;
    if (table !== null) for (let e = 0; e < table.size; e++) if (table.values[e] !== 0) n++;
    return n;
  };
  for (const arr of [stats.start, stats.transitions, stats.end, stats.emissions]) {
    denseCells += arr.length;
    for (let i = 0; i < arr.length; i++) if (arr[i] !== 0) cells++;
  }
  const sparseEntries = nonZero(stats.prevWord) + nonZero(stats.trigrams) + nonZero(stats.contextEmissions);
  cells += sparseEntries;
  const bytes = representation === "dense" ? 8 * denseCells + 16 * sparseEntries : 16 * cells;
  return { cells, bytes };
}
