import { addCount, createCountTable, findEntry, getCount, type CountTable } from "./count-table";
import { buildContextEmissionTable, type ContextEmissionTable } from "./context-emissions";
import { estimateAddLambda, shrinkTowardParent } from "./smoothing";
import type { SufficientStatistics } from "./sufficient-statistics";

/** Previous-word transition counts grouped by context (previous symbol, previous state), CSR. */
export type PrevWordTable = {
  /** context key (previous symbol·K + previous state) → row index. */
  readonly rows: CountTable;
  readonly offsets: Int32Array;
  /** Next states of each row and their counts. */
  readonly entries: Int32Array;
  readonly values: Float64Array;
};

/**
 * Second-order transitions by deleted interpolation (Brants 2000, §2.2):
 * P(z | x, y) = λ1·P̂(z) + λ2·P1(z | y) + λ3·P̂(z | x, y), where P1 is the first-order
 * (smoothed, possibly position-aware) transition and P̂ are maximum-likelihood estimates over
 * state triples of sentences padded with the boundary index K (BOS BOS … EOS).
 */
export type TrigramTable = {
  /** λ1, λ2, λ3 (sum to 1). */
  readonly lambdas: readonly [number, number, number];
  /** K+1 maximum-likelihood probabilities of each outcome (index K = EOS). */
  readonly unigram: Float64Array;
  /** Triple counts and history totals, keyed as in SufficientStatistics.trigrams. */
  readonly counts: CountTable;
  readonly histories: CountTable;
};

/** Everything the decoders read, estimated from sufficient statistics. Log-probabilities. */
export type ModelParameters = {
  /** SB×K start distributions, one per sentence bucket. */
  readonly start: Float64Array;
  /** B×K×K transition matrices, one per position bucket; rows sum with `end` to 1. */
  readonly transitions: Float64Array;
  /** K end log-probabilities, or null when the model has no end state. */
  readonly end: Float64Array | null;
  /** S×K emission log-probabilities, row = symbol. */
  readonly emissions: Float64Array;
  readonly prevWord: PrevWordTable | null;
  readonly trigram: TrigramTable | null;
  readonly contextEmission: ContextEmissionTable | null;
};

/** Options of {@link estimateParameters}. */
export type EstimationOptions = {
  readonly smoothing: { readonly start: number; readonly transition: number; readonly emission: number };
  /** K×K pseudo-counts replacing smoothing.transition per cell (0 for forbidden cells), or null. */
  readonly transitionPrior: Float64Array | null;
  /** K pseudo-counts replacing smoothing.start per state, or null. */
  readonly startPrior: Float64Array | null;
  readonly endState: boolean;
  readonly positionStrength: number;
  /** Number of emission outcomes |B| in the add-λ denominator (normally S; NLTK uses V). */
  readonly emissionBins: number;
};

/**
 * Turns counts into parameters (the M-step of EM as well as supervised training):
 * - start: add-λ over the K states, then each sentence bucket shrunk toward it;
 * - transitions: add-λ per row over K next states (+ the end state when on), with per-cell
 *   pseudo-counts; each position bucket shrunk toward the position-free row (MacKay & Peto 1995,
 *   "A hierarchical Dirichlet language model"; see shrinkTowardParent)
 *   within the row's non-end mass;
 * - emissions: add-λ per state over `emissionBins` symbols;
 * - previous-word and trigram tables as described by their types.
 * Deterministic: the same statistics always give bit-identical parameters.
 */
export function estimateParameters(stats: SufficientStatistics, options: EstimationOptions): ModelParameters {
  const K = stats.states;
  const S = stats.symbols;
  const B = stats.buckets;
  const SB = stats.sentenceBuckets;
  const KK = K * K;
  const { smoothing, endState, positionStrength } = options;
  if (options.transitionPrior !== null && options.transitionPrior.length !== KK) {
    throw new RangeError(`estimateParameters: transitionPrior has length ${options.transitionPrior.length}, expected K×K=${KK}`);
  }
  if (options.startPrior !== null && options.startPrior.length !== K) {
    throw new RangeError(`estimateParameters: startPrior has length ${options.startPrior.length}, expected K=${K}`);
  }

  // Start: position-free estimate, then one per sentence bucket.
  const startTotals = new Float64Array(K);
  for (let b = 0; b < SB; b++) for (let k = 0; k < K; k++) startTotals[k] += stats.start[b * K + k];
  const startFree = estimateAddLambda(startTotals, 1, K, options.startPrior ?? smoothing.start).table;
  const start = new Float64Array(SB * K);
  if (SB === 1) start.set(startFree);
  else for (let b = 0; b < SB; b++) shrinkTowardParent(stats.start, b * K, K, positionStrength, startFree, 0, start, b * K);

  // Transitions: position-free rows (with the end state as an extra outcome), then buckets.
  const transitionTotals = new Float64Array(KK);
  for (let b = 0; b < B; b++) for (let x = 0; x < KK; x++) transitionTotals[x] += stats.transitions[b * KK + x];
  const free = estimateAddLambda(
    transitionTotals,
    K,
    K,
    options.transitionPrior ?? smoothing.transition,
    endState ? { counts: stats.end, prior: smoothing.transition } : null,
  );
  const end = free.extra;
  const transitions = new Float64Array(B * KK);
  if (B === 1) {
    transitions.set(free.table);
  } else {
    // Within each row, buckets redistribute the non-end mass: P_b(j|i) = (1 − P(end|i))·Q_b(j|i),
    // Q_b shrunk toward Q(j|i) = P(j|i)/(1 − P(end|i)).
    const conditional = new Float64Array(KK);
    const keep = new Float64Array(K);
    for (let i = 0; i < K; i++) {
      const logKeep = end === null ? 0 : Math.log1p(-Math.exp(end[i]));
      keep[i] = logKeep;
      for (let j = 0; j < K; j++) conditional[i * K + j] = free.table[i * K + j] - logKeep;
    }
    for (let b = 0; b < B; b++) {
      for (let i = 0; i < K; i++) {
        shrinkTowardParent(stats.transitions, b * KK + i * K, K, positionStrength, conditional, i * K, transitions, b * KK + i * K, keep[i]);
      }
    }
    // A cell forbidden by a zero pseudo-count stays forbidden in every bucket.
    for (let b = 0; b < B; b++) for (let x = 0; x < KK; x++) if (free.table[x] === -Infinity) transitions[b * KK + x] = -Infinity;
  }

  // Emissions: add-λ per state over |B| = emissionBins symbols; the table is stored symbol-major.
  const emissions = new Float64Array(S * K);
  const stateTotals = new Float64Array(K);
  for (let s = 0; s < S; s++) for (let k = 0; k < K; k++) stateTotals[k] += stats.emissions[s * K + k];
  const lambda = smoothing.emission;
  for (let k = 0; k < K; k++) {
    const denominator = stateTotals[k] + lambda * options.emissionBins;
    const logDenominator = Math.log(denominator);
    for (let s = 0; s < S; s++) {
      const numerator = stats.emissions[s * K + k] + lambda;
      emissions[s * K + k] = denominator <= 0 ? -Math.log(options.emissionBins) : numerator > 0 ? Math.log(numerator) - logDenominator : -Infinity;
    }
  }

  return {
    start,
    transitions,
    end,
    emissions,
    prevWord: stats.prevWord === null ? null : buildPrevWordTable(stats.prevWord, K),
    trigram: stats.trigrams === null ? null : buildTrigramTable(stats.trigrams, K, endState),
    contextEmission: stats.contextEmissions === null ? null : buildContextEmissionTable(stats.contextEmissions, S),
  };
}

/**
 * Groups previous-word counts by context into CSR rows, contexts in order of first appearance in
 * the map and entries in insertion order (no sort: the map can be large, and serialization keeps
 * insertion order, so a loaded model gets the same rows).
 */
export function buildPrevWordTable(counts: CountTable, K: number): PrevWordTable {
  const rows = createCountTable();
  const sizes: number[] = [];
  for (let e = 0; e < counts.size; e++) {
    if (!(counts.values[e] > 0)) continue;
    const context = Math.floor(counts.keys[e] / K);
    const found = findEntry(rows, context);
    if (found < 0) {
      addCount(rows, context, sizes.length);
      sizes.push(1);
    } else {
      sizes[rows.values[found]]++;
    }
  }
  const offsets = new Int32Array(sizes.length + 1);
  for (let r = 0; r < sizes.length; r++) offsets[r + 1] = offsets[r] + sizes[r];
  const fill = offsets.slice(0, sizes.length);
  const entries = new Int32Array(offsets[sizes.length]);
  const values = new Float64Array(offsets[sizes.length]);
  for (let e = 0; e < counts.size; e++) {
    const v = counts.values[e];
    if (!(v > 0)) continue;
    const context = Math.floor(counts.keys[e] / K);
    const x = fill[getCount(rows, context)]++;
    entries[x] = counts.keys[e] - context * K;
    values[x] = v;
  }
  return { rows, offsets, entries, values };
}

/** Row index of a previous-word context, or −1. */
export function prevWordRow(table: PrevWordTable, context: number): number {
  const e = findEntry(table.rows, context);
  return e < 0 ? -1 : table.rows.values[e];
}

/**
 * Deleted interpolation weights (Brants 2000, §2.2, Figure 1): for every triple with f(x,y,z) > 0,
 * compare (f(x,y,z)−1)/(f(x,y)−1), (f(y,z)−1)/(f(y)−1) and (f(z)−1)/(N−1) (a ratio with a zero
 * denominator counts as 0) and add f(x,y,z) to the λ of the largest; normalise. Ties go to the
 * higher order (the paper does not say; common practice). Here f(x,y) and f(y) are history
 * totals over the same padded positions, so each P̂ is a proper conditional distribution.
 */
export function buildTrigramTable(trigrams: CountTable, K: number, endState: boolean): TrigramTable {
  const K1 = K + 1;
  const counts = createCountTable();
  for (let e = 0; e < trigrams.size; e++) {
    const key = trigrams.keys[e];
    const v = trigrams.values[e];
    if (v > 0 && (endState || key % K1 !== K)) addCount(counts, key, v);
  }
  const histories = createCountTable();
  const bigrams = new Map<number, number>();
  const bigramHistories = new Float64Array(K1);
  const unigramCounts = new Float64Array(K1);
  let N = 0;
  for (let e = 0; e < counts.size; e++) {
    const key = counts.keys[e];
    const v = counts.values[e];
    const z = key % K1;
    const history = (key - z) / K1;
    const y = history % K1;
    addCount(histories, history, v);
    bigrams.set(y * K1 + z, (bigrams.get(y * K1 + z) ?? 0) + v);
    bigramHistories[y] += v;
    unigramCounts[z] += v;
    N += v;
  }
  const lambda = [0, 0, 0];
  for (let e = 0; e < counts.size; e++) {
    const key = counts.keys[e];
    const v = counts.values[e];
    const z = key % K1;
    const history = (key - z) / K1;
    const y = history % K1;
    const ratio = (num: number, den: number) => (den > 0 ? num / den : 0);
    const c3 = ratio(v - 1, getCount(histories, history) - 1);
    const c2 = ratio(bigrams.get(y * K1 + z)! - 1, bigramHistories[y] - 1);
    const c1 = ratio(unigramCounts[z] - 1, N - 1);
    if (c3 >= c2 && c3 >= c1) lambda[2] += v;
    else if (c2 >= c1) lambda[1] += v;
    else lambda[0] += v;
  }
  const total = lambda[0] + lambda[1] + lambda[2];
  const lambdas: [number, number, number] = total > 0 ? [lambda[0] / total, lambda[1] / total, lambda[2] / total] : [0, 1, 0];
  const unigram = new Float64Array(K1);
  for (let z = 0; z < K1; z++) unigram[z] = N > 0 ? unigramCounts[z] / N : 0;
  return { lambdas, unigram, counts, histories };
}
