import { addCount } from "./count-table";
import { emissionContext } from "./context-emissions";
import { fillTransitionBuckets, sentenceBucketOf, type PositionBuckets } from "./position-buckets";
import { createSufficientStatistics, type SufficientStatistics } from "./sufficient-statistics";

/**
 * A labelled corpus already mapped to ids: all tokens concatenated, sentence s spanning
 * [sentenceStarts[s], sentenceStarts[s+1]); `sentenceIndex[s]` is its index within its document.
 */
export type EncodedCorpus = {
  readonly symbols: Int32Array;
  readonly tags: Int32Array;
  readonly sentenceStarts: Int32Array;
  readonly sentenceIndex: Int32Array;
};

/** Shape of the statistics to collect. */
export type CountingShape = {
  readonly states: number;
  readonly symbols: number;
  readonly positionBuckets: PositionBuckets;
  readonly prevWord: boolean;
  readonly trigrams: boolean;
  /** K×K segment-start table (context-emissions.ts) when context-conditioned emissions are on. */
  readonly segmentStarts: Uint8Array | null;
};

/** Throws RangeError unless the corpus arrays agree with each other and with the shape. */
export function checkEncodedCorpus(corpus: EncodedCorpus, shape: { states: number; symbols: number }): void {
  const N = corpus.symbols.length;
  if (corpus.tags.length !== N) throw new RangeError(`encoded corpus: ${N} symbols but ${corpus.tags.length} tags`);
  const S = corpus.sentenceStarts.length - 1;
  if (S < 0 || corpus.sentenceStarts[0] !== 0 || corpus.sentenceStarts[S] !== N) {
    throw new RangeError(`encoded corpus: sentenceStarts must run from 0 to the token count ${N}`);
  }
  if (corpus.sentenceIndex.length !== S) throw new RangeError(`encoded corpus: ${S} sentences but ${corpus.sentenceIndex.length} sentence indices`);
  for (let s = 0; s < S; s++) {
    if (corpus.sentenceStarts[s + 1] < corpus.sentenceStarts[s]) throw new RangeError(`encoded corpus: sentence ${s} ends before it starts`);
  }
  for (let n = 0; n < N; n++) {
    if (corpus.symbols[n] < 0 || corpus.symbols[n] >= shape.symbols) throw new RangeError(`encoded corpus: symbol ${corpus.symbols[n]} at token ${n} outside S=${shape.symbols}`);
    if (corpus.tags[n] < 0 || corpus.tags[n] >= shape.states) throw new RangeError(`encoded corpus: tag ${corpus.tags[n]} at token ${n} outside K=${shape.states}`);
  }
}

/**
 * Supervised counting (maximum-likelihood sufficient statistics of an HMM from tagged sequences,
 * Rabiner 1989 §III-C with the state sequence observed): start, per-bucket transition, end and
 * emission counts, plus previous-word and trigram counts when asked. One pass, no allocation per
 * token except for the sparse maps.
 */
export function countSupervised(corpus: EncodedCorpus, shape: CountingShape): SufficientStatistics {
  const { states: K, symbols: S, positionBuckets } = shape;
  checkEncodedCorpus(corpus, { states: K, symbols: S });
  const sentenceBuckets = positionBuckets.sentence.length + 1;
  const buckets = (positionBuckets.token.length + 1) * sentenceBuckets;
  const segmentStarts = shape.segmentStarts;
  if (segmentStarts !== null && segmentStarts.length !== K * K) throw new RangeError(`countSupervised: segmentStarts has length ${segmentStarts.length}, expected K×K=${K * K}`);
  const stats = createSufficientStatistics({
    states: K,
    symbols: S,
    buckets,
    sentenceBuckets,
    prevWord: shape.prevWord,
    trigrams: shape.trigrams,
    contextEmissions: segmentStarts !== null,
  });
  const { start, transitions, end, emissions, prevWord, trigrams, contextEmissions } = stats;
  const { symbols, tags, sentenceStarts, sentenceIndex } = corpus;
  const KK = K * K;
  const K1 = K + 1;
  const sentences = sentenceStarts.length - 1;
  let longest = 0;
  for (let s = 0; s < sentences; s++) longest = Math.max(longest, sentenceStarts[s + 1] - sentenceStarts[s]);
  const bucketOf = new Int32Array(Math.max(1, longest));
  const positionFree = buckets === 1;
  for (let s = 0; s < sentences; s++) {
    const from = sentenceStarts[s];
    const to = sentenceStarts[s + 1];
    const T = to - from;
    if (T === 0) continue;
    stats.sentences++;
    stats.tokens += T;
    if (!positionFree) fillTransitionBuckets(positionBuckets, T, sentenceIndex[s], bucketOf);
    const sb = sentenceBuckets === 1 ? 0 : sentenceBucketOf(positionBuckets, sentenceIndex[s]);
    let prev = tags[from];
    start[sb * K + prev]++;
    emissions[symbols[from] * K + prev]++;
    for (let n = from + 1; n < to; n++) {
      const tag = tags[n];
      const m = positionFree ? 0 : bucketOf[n - from] * KK;
      transitions[m + prev * K + tag]++;
      emissions[symbols[n] * K + tag]++;
      prev = tag;
    }
    end[prev]++;
    if (prevWord !== null) {
      for (let n = from + 1; n < to; n++) {
        const key = (symbols[n - 1] * K + tags[n - 1]) * K + tags[n];
        addCount(prevWord, key, 1);
      }
    }
    if (contextEmissions !== null && segmentStarts !== null) {
      for (let n = from; n < to; n++) {
        const j = tags[n];
        const context = n === from ? K : emissionContext(segmentStarts, K, tags[n - 1], j, symbols[n - 1]);
        const key = (context * K + j) * S + symbols[n];
        addCount(contextEmissions, key, 1);
      }
    }
    if (trigrams !== null) {
      let x = K;
      let y = K;
      for (let n = from; n <= to; n++) {
        const z = n === to ? K : tags[n];
        const key = (x * K1 + y) * K1 + z;
        addCount(trigrams, key, 1);
        x = y;
        y = z;
      }
    }
  }
  return stats;
}
