import { addCount, createCountTable, findEntry, getCount, type CountTable } from "./count-table";

/**
 * Emissions conditioned on context, after Bikel et al. (1997), "Nymble: a high-performance
 * learning name-finder", ANLP, §3.1: the first word of a name class is generated given the
 * current and the previous class, every later word of the class given the previous word. In IOB2
 * terms a segment starts at B-X, and at O after a non-O state (plain tags: at any change of
 * state). The table keeps (context, state, symbol) counts; a context is a previous state
 * (0..K−1), the sentence start (K), or a previous symbol s (K+1+s). Probabilities back off to the
 * context-free emission P(w | state) with Witten–Bell weights (Witten & Bell 1991, "The
 * Zero-Frequency Problem", method C; see interpolateWittenBell), so a model
 * can fold the ratio P(w | state, context)/P(w | state) into its per-step transition scores.
 */
export type ContextEmissionTable = {
  /** ((context·K + state)·S + symbol) → count. */
  readonly counts: CountTable;
  /** (context·K + state) → total count n and number of distinct symbols u. */
  readonly totals: CountTable;
  readonly distinct: CountTable;
};

/** K×K: 1 where moving from state i to state j starts a new segment. */
export function segmentStartTable(tags: readonly string[], scheme: "iob" | "plain"): Uint8Array {
  const K = tags.length;
  const table = new Uint8Array(K * K);
  const type = (tag: string) => (tag === "O" ? "O" : tag.slice(2));
  for (let i = 0; i < K; i++) {
    for (let j = 0; j < K; j++) {
      table[i * K + j] = scheme === "iob" ? (tags[j].startsWith("B-") || type(tags[i]) !== type(tags[j]) ? 1 : 0) : i !== j ? 1 : 0;
    }
  }
  return table;
}

/** Context of emitting state j at token t after state i (t ≥ 1) with previous symbol `previous`. */
export function emissionContext(segmentStarts: Uint8Array, K: number, i: number, j: number, previous: number): number {
  return segmentStarts[i * K + j] === 1 ? i : K + 1 + previous;
}

/**
 * Builds the per-row totals of a count map (S symbols, K states). The counts map is used as is
 * (not copied: it can hold a million entries); rows are summed in the map's insertion order, which
 * serialization preserves, so a loaded model sums fractional counts identically.
 */
export function buildContextEmissionTable(counts: CountTable, S: number): ContextEmissionTable {
  const totals = createCountTable();
  const distinct = createCountTable();
  for (let e = 0; e < counts.size; e++) {
    const v = counts.values[e];
    if (!(v > 0)) continue;
    const row = Math.floor(counts.keys[e] / S);
    addCount(totals, row, v);
    addCount(distinct, row, 1);
  }
  return { counts, totals, distinct };
}

/**
 * log(P(symbol | state, context)/P(symbol | state)) with Witten–Bell back-off:
 * P = (c + u·P(symbol | state))/(n + u), so the ratio is (c/P(symbol | state) + u)/(n + u);
 * 0 when the context was never seen with this state.
 */
export function contextEmissionLogRatio(table: ContextEmissionTable, S: number, K: number, context: number, state: number, symbol: number, baseLog: number): number {
  const row = context * K + state;
  const entry = findEntry(table.totals, row);
  if (entry < 0) return 0;
  const n = table.totals.values[entry];
  // totals and distinct gained their rows in the same order, so the entry numbers agree.
  const u = table.distinct.values[entry];
  const c = getCount(table.counts, row * S + symbol);
  const ratio = (c / Math.exp(baseLog) + u) / (n + u);
  return Math.log(ratio);
}
