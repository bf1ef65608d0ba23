import { contextEmissionLogRatio, emissionContext } from "../estimation/context-emissions";
import { getCount } from "../estimation/count-table";
import { prevWordRow } from "../estimation/estimate";
import type { HmmParams, EmissionInput } from "../kernels/hmm-params";
import { fillTransitionBuckets, sentenceBucketOf } from "../estimation/position-buckets";
import type { SecondOrderLattice } from "../kernels/second-order-lattice";
import { interpolateWittenBell } from "../estimation/smoothing";
import { suffixLogRatio } from "../estimation/suffix-model";
import type { TaggerModel } from "./tagger-model";
import { encodeWords, suffixGroupOf } from "../estimation/vocabulary";
import { addEmissionAdjustments, addTokenAdjustments } from "../estimation/emission-adjustments";

/**
 * Symbols and the T×K emission lattice of a sentence. A known word reads its row of the emission
 * table; an unknown or rare word reads its class's row, times the suffix likelihood ratio
 * P(t | class, suffix)/P̂(t | class) when suffix statistics are on: by Bayes, P(class, suffix | t)
 * ∝ P(class | t)·P(t | class, suffix)/P(t | class), up to a factor that does not depend on t
 * (Brants 2000 §2.3 uses the same inversion of P(t | suffix)).
 */
export function buildEmissionLattice(model: TaggerModel, words: readonly string[]): { symbols: Int32Array; lattice: Float64Array } {
  const K = model.tags.length;
  const T = words.length;
  const symbols = encodeWords(model.vocabulary, words);
  const lattice = new Float64Array(T * K);
  const { emissions } = model.parameters;
  const V = model.vocabulary.words.length;
  const ratio = new Float64Array(K);
  const scratch = new Float64Array(2 * K);
  for (let t = 0; t < T; t++) {
    const s = symbols[t];
    const row = s * K;
    const out = t * K;
    for (let k = 0; k < K; k++) lattice[out + k] = emissions[row + k];
    if (s >= V && model.suffix !== null) {
      suffixLogRatio(model.suffix, words[t], suffixGroupOf(model.vocabulary, words[t], t === 0), ratio, scratch);
      for (let k = 0; k < K; k++) lattice[out + k] += ratio[k];
    }
    addEmissionAdjustments(model, words[t], t === 0, s, lattice, out);
  }
  addTokenAdjustments(model, words, lattice, null);
  return { symbols, lattice };
}

/** log(1 − P(end | i)) per state: the share of each transition row that continues the sentence. */
function continuationLogs(model: TaggerModel): Float64Array {
  const K = model.tags.length;
  const keep = new Float64Array(K);
  const end = model.parameters.end;
  if (end !== null) for (let i = 0; i < K; i++) keep[i] = Math.log1p(-Math.exp(end[i]));
  return keep;
}

/**
 * The first-order decoding problem of one sentence: parameters (start of the sentence's bucket,
 * transition matrices, end) and the emission input. With previous-word transitions every step
 * gets its own matrix: each row P(j | i, w_{t-1}) is the Witten–Bell interpolation of the counts
 * seen after (w_{t-1}, i) with the position-aware row P(j | i), both conditioned on the sentence
 * continuing (Bikel et al. 1997 condition the next name class on the previous class and word).
 */
export function buildFirstOrderProblem(
  model: TaggerModel,
  words: readonly string[],
  sentenceIndex = 0,
): { params: HmmParams; input: EmissionInput; symbols: Int32Array } {
  const K = model.tags.length;
  const KK = K * K;
  const T = words.length;
  const { parameters, config } = model;
  const { symbols, lattice } = buildEmissionLattice(model, words);
  const sb = sentenceBucketOf(config.positionBuckets, sentenceIndex);
  const start = parameters.start.subarray(sb * K, sb * K + K);
  const B = model.statistics.buckets;
  let buckets: Int32Array | null = null;
  if (B > 1) buckets = fillTransitionBuckets(config.positionBuckets, T, sentenceIndex, new Int32Array(Math.max(T, 1)));
  const contextTable = parameters.contextEmission;
  const segmentStarts = model.segmentStarts;
  const S = model.statistics.symbols;
  let sentenceStart = start;
  if (contextTable !== null && T > 0) {
    sentenceStart = start.slice();
    for (let j = 0; j < K; j++) sentenceStart[j] += contextEmissionLogRatio(contextTable, S, K, K, j, symbols[0], parameters.emissions[symbols[0] * K + j]);
  }
  if ((parameters.prevWord === null && contextTable === null) || T < 2) {
    return {
      params: { states: K, start: sentenceStart, transitions: parameters.transitions, end: parameters.end },
      input: { length: T, scores: lattice, rows: null, transitionIndex: buckets },
      symbols,
    };
  }
  const table = parameters.prevWord;
  const keep = continuationLogs(model);
  const conditional = new Float64Array(K);
  const transitions = new Float64Array(T * KK);
  const allowed = model.constraints?.allowed ?? null;
  transitions.set(parameters.transitions.subarray(0, KK));
  for (let t = 1; t < T; t++) {
    const base = (buckets === null ? 0 : buckets[t]) * KK;
    for (let i = 0; i < K; i++) {
      const out = t * KK + i * K;
      const row = table === null ? -1 : prevWordRow(table, symbols[t - 1] * K + i);
      if (table === null || row < 0) {
        for (let j = 0; j < K; j++) transitions[out + j] = parameters.transitions[base + i * K + j];
      } else {
        for (let j = 0; j < K; j++) conditional[j] = parameters.transitions[base + i * K + j] - keep[i];
        interpolateWittenBell(table.entries, table.values, table.offsets[row], table.offsets[row + 1], conditional, 0, K, transitions, out);
        for (let j = 0; j < K; j++) transitions[out + j] += keep[i];
        if (allowed !== null) for (let j = 0; j < K; j++) if (allowed[i * K + j] === 0) transitions[out + j] = -Infinity;
      }
      if (contextTable !== null && segmentStarts !== null) {
        // Fold P(w_t | j, context)/P(w_t | j) into the step's score for i → j.
        const symbol = symbols[t];
        for (let j = 0; j < K; j++) {
          const context = emissionContext(segmentStarts, K, i, j, symbols[t - 1]);
          transitions[out + j] += contextEmissionLogRatio(contextTable, S, K, context, j, symbol, parameters.emissions[symbol * K + j]);
        }
      }
    }
  }
  const index = new Int32Array(T);
  for (let t = 0; t < T; t++) index[t] = t;
  return {
    params: { states: K, start: sentenceStart, transitions, end: parameters.end },
    input: { length: T, scores: lattice, rows: null, transitionIndex: index },
    symbols,
  };
}

/** Tag sets larger than this are pruned per token by emission score in second-order decoding. */
export const SECOND_ORDER_DENSE_LIMIT = 40;

/**
 * The second-order decoding lattice of one sentence (see SecondOrderLattice). Transition scores
 * follow Brants (2000) §2.2: λ1·P̂(z) + λ2·P1(z | y) + λ3·P̂(z | x, y), where P1 is the model's
 * first-order distribution at that position (start, bucketed transition or end); when the history
 * (x, y) was never seen the λ3 term is dropped and λ1, λ2 renormalised. Previous-word counts, when
 * on, are interpolated on top as in {@link buildFirstOrderProblem}. For more than
 * SECOND_ORDER_DENSE_LIMIT states a known word keeps the states it was seen with in training and
 * an unknown word the states whose emission score is within a factor `config.beam` of its best
 * (in the spirit of TnT's beam search, Brants 2000 §2.4); the likelihood is then that of the
 * pruned lattice.
 */
export function buildSecondOrderLattice(model: TaggerModel, words: readonly string[], sentenceIndex = 0): { lattice: SecondOrderLattice; symbols: Int32Array } {
  const trigram = model.parameters.trigram;
  if (trigram === null) throw new RangeError("buildSecondOrderLattice: the model has no second-order statistics (order 1)");
  const K = model.tags.length;
  const KK = K * K;
  const K1 = K + 1;
  const T = words.length;
  const { parameters, config } = model;
  const { symbols, lattice: emissionLattice } = buildEmissionLattice(model, words);
  const sb = sentenceBucketOf(config.positionBuckets, sentenceIndex);
  const startRow = parameters.start.subarray(sb * K, sb * K + K);
  const buckets = model.statistics.buckets > 1 ? fillTransitionBuckets(config.positionBuckets, T, sentenceIndex, new Int32Array(Math.max(T, 1))) : null;
  const end = parameters.end;
  const [l1, l2, l3] = trigram.lambdas;
  const allowed = model.constraints?.allowed ?? null;
  const allowedStart = model.constraints?.allowedStart ?? null;

  // Candidates: every state for small tag sets; otherwise the states seen with a known word in
  // training (a tag dictionary, as TnT's maximum-likelihood lexical probabilities imply), and for
  // unknown words the states within the beam of the best emission score.
  const offsets = new Int32Array(T + 1);
  const candidateList: number[] = [];
  const emissionList: number[] = [];
  const logBeam = Math.log(config.beam);
  const V = model.vocabulary.words.length;
  const counts = model.statistics.emissions;
  for (let t = 0; t < T; t++) {
    const known = symbols[t] < V;
    let best = -Infinity;
    for (let k = 0; k < K; k++) best = Math.max(best, emissionLattice[t * K + k]);
    for (let k = 0; k < K; k++) {
      const e = emissionLattice[t * K + k];
      const keep = K <= SECOND_ORDER_DENSE_LIMIT || (known ? counts[symbols[t] * K + k] > 0 : e >= best - logBeam);
      if (keep) {
        candidateList.push(k);
        emissionList.push(e);
      }
    }
    offsets[t + 1] = candidateList.length;
  }
  const candidates = Int32Array.from(candidateList);
  const emissions = Float64Array.from(emissionList);
  const size = (t: number) => offsets[t + 1] - offsets[t];

  // P1 row lookups: the first-order distribution of z given y at position t (y = K: sentence start).
  const firstOrder = (y: number, z: number, t: number): number => {
    if (z === K) return end === null ? 0 : Math.exp(end[y]);
    if (y === K) return Math.exp(startRow[z]);
    const m = buckets === null ? 0 : buckets[t];
    return Math.exp(parameters.transitions[m * KK + y * K + z]);
  };
  // Interpolated trigram probability P(z | x, y) at position t (z = K: EOS), without the previous word.
  const trigramProbability = (x: number, y: number, z: number, t: number): number => {
    const history = x * K1 + y;
    const seen = getCount(trigram.histories, history);
    const p12 = l1 * trigram.unigram[z] + l2 * firstOrder(y, z, t);
    if (seen === 0) return l1 + l2 > 0 ? p12 / (l1 + l2) : firstOrder(y, z, t);
    return p12 + (l3 * getCount(trigram.counts, history * K1 + z)) / seen;
  };
  const prevTable = parameters.prevWord;
  const contextTable = parameters.contextEmission;
  const segmentStarts = model.segmentStarts;
  const S = model.statistics.symbols;
  // log P(z | x, y [, w_{t-1}]) with the IOB2 constraints applied.
  const score = (x: number, y: number, z: number, t: number): number => {
    if (z < K && (y === K ? allowedStart !== null && allowedStart[z] === 0 : allowed !== null && allowed[y * K + z] === 0)) return -Infinity;
    let p = trigramProbability(x, y, z, t);
    const row = prevTable !== null && z < K && y < K && t >= 1 ? prevWordRow(prevTable, symbols[t - 1] * K + y) : -1;
    if (prevTable !== null && row >= 0) {
      // Witten–Bell over the continuation, as in the first-order case: the counts after (w, y)
      // are conditional on the sentence going on, so interpolate P(z | x, y, not EOS) and rescale.
      const keep = end === null ? 1 : 1 - trigramProbability(x, y, K, t);
      const from = prevTable.offsets[row];
      const to = prevTable.offsets[row + 1];
      let n = 0;
      let c = 0;
      for (let e = from; e < to; e++) {
        n += prevTable.values[e];
        if (prevTable.entries[e] === z) c = prevTable.values[e];
      }
      const u = to - from;
      const backoff = keep > 0 ? p / keep : 0;
      p = (keep * (c + u * backoff)) / (n + u);
    }
    if (!(p > 0)) return -Infinity;
    let logP = Math.log(p);
    if (contextTable !== null && segmentStarts !== null && z < K) {
      const context = y === K ? K : emissionContext(segmentStarts, K, y, z, symbols[t - 1]);
      logP += contextEmissionLogRatio(contextTable, S, K, context, z, symbols[t], parameters.emissions[symbols[t] * K + z]);
    }
    return logP;
  };

  const start = new Float64Array(T > 0 ? size(0) : 0);
  for (let a = 0; a < start.length; a++) start[a] = score(K, K, candidates[a], 0);
  const second = new Float64Array(T >= 2 ? size(0) * size(1) : 0);
  if (T >= 2) {
    for (let a = 0; a < size(0); a++) {
      for (let b = 0; b < size(1); b++) second[a * size(1) + b] = score(K, candidates[a], candidates[offsets[1] + b], 1);
    }
  }
  const blockOffsets = new Int32Array(Math.max(T, 0));
  let total = 0;
  for (let t = 2; t < T; t++) {
    blockOffsets[t] = total;
    total += size(t - 2) * size(t - 1) * size(t);
  }
  const blocks = new Float64Array(total);
  for (let t = 2; t < T; t++) {
    const nB = size(t - 1);
    const nC = size(t);
    for (let a = 0; a < size(t - 2); a++) {
      const x = candidates[offsets[t - 2] + a];
      for (let b = 0; b < nB; b++) {
        const y = candidates[offsets[t - 1] + b];
        for (let c = 0; c < nC; c++) blocks[blockOffsets[t] + (a * nB + b) * nC + c] = score(x, y, candidates[offsets[t] + c], t);
      }
    }
  }
  let endBlock: Float64Array | null = null;
  if (end !== null && T >= 1) {
    if (T === 1) {
      endBlock = Float64Array.from({ length: size(0) }, (_, a) => score(K, candidates[a], K, T));
    } else {
      const nB = size(T - 1);
      endBlock = new Float64Array(size(T - 2) * nB);
      for (let a = 0; a < size(T - 2); a++) {
        for (let b = 0; b < nB; b++) endBlock[a * nB + b] = score(candidates[offsets[T - 2] + a], candidates[offsets[T - 1] + b], K, T);
      }
    }
  }
  return {
    lattice: { length: T, states: K, offsets, candidates, emissions, start, second, blockOffsets, blocks, end: endBlock },
    symbols,
  };
}
