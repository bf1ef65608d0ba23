/**
 * Word clusters in the emission model for unknown and rare words. Miller, Guinness & Zamanian
 * (2004), "Name tagging with word clusters and discriminative training", HLT-NAACL, §2–3, give a
 * name tagger the prefixes of each word's Brown bit string as features, so that a word seen
 * rarely or never in the labelled data is read through the company it keeps in unlabelled text.
 * Here the same prefixes refine the word-class emission of such a word, the way suffixes do
 * (suffix-model.ts): tag counts of infrequent training words are kept per (word class, bit-string
 * prefix) and combined from the shortest prefix to the longest by successive abstraction
 * (Samuelsson 1996, as Brants 2000 §2.3 does for suffixes),
 *   P(t | class, b₁…b_i) = (P̂(t | class, b₁…b_i) + θ·P(t | class, b₁…b_{i−1})) / (1 + θ),
 * and the emission of the class symbol is multiplied by P(t | class, path)/P̂(t | class): by
 * Bayes, P(class, path | t) ∝ P(class | t)·P(t | class, path)/P(t | class) up to a factor that does
 * not depend on t (the class-based backoff P(w | t) ≈ P(class, cluster | t)·P(w | class, cluster),
 * with the second factor the same for every tag). With suffixes on too, both ratios apply, as if
 * suffix and cluster were independent given the class and the tag.
 */
import { clusterOf, type WordClusters } from "./brown-clusters";
import { createSuffixCollector, suffixLogRatio, type SuffixStatistics } from "./suffix-model";
import { suffixGroupOf, type Vocabulary } from "./vocabulary";

/** Clusters and the tag statistics of their bit-string prefixes, per word class. */
export type ClusterEmissions = {
  readonly clusters: WordClusters;
  /**
   * Prefix statistics in the suffix model's layout: a cluster's bit string is stored reversed,
   * so that the suffix model's suffixes are the bit string's prefixes.
   */
  readonly statistics: SuffixStatistics;
  /** Reversed bit string of each cluster (not serialized). */
  readonly reversedPaths: readonly string[];
  /** Buffers of {@link addClusterLogRatio} (K and 2K entries). */
  readonly ratio: Float64Array;
  readonly scratch: Float64Array;
};

/**
 * Successive-abstraction weight θ of the prefix statistics: 1 over 0.25 and 4 by 5-fold CV on
 * lower-cased wikigold train+dev with 50 clusters that also saw the held-out text (F1 0.4293
 * against 0.4234 and 0.4285). The statistics count the tokens of words seen at most
 * suffixMaxFrequency (10) times, as the suffix model does (0.4293 against 0.4262 for words seen
 * at most `rare` times and 0.4124 for every word).
 */
export const CLUSTER_THETA = 1;

const reverse = (path: string) => path.split("").reverse().join("");

/** Statistics from their parts (a trained or a loaded model). */
export function createClusterEmissions(clusters: WordClusters, statistics: SuffixStatistics): ClusterEmissions {
  const K = statistics.states;
  return { clusters, statistics, reversedPaths: clusters.paths.map(reverse), ratio: new Float64Array(K), scratch: new Float64Array(2 * K) };
}

/** Collects the prefix statistics: `add` once per training token of an infrequent word, then `finish`. */
export function createClusterCollector(clusters: WordClusters, states: number): {
  add(word: string, group: number, tag: number): void;
  finish(theta: number): ClusterEmissions;
} {
  const longest = clusters.paths.reduce((n, p) => Math.max(n, p.length), 0);
  const collector = createSuffixCollector(states, longest);
  const reversed = clusters.paths.map(reverse);
  return {
    add(word, group, tag) {
      const c = clusterOf(clusters, word);
      if (c >= 0) collector.add(reversed[c], group, tag);
    },
    finish(theta) {
      return createClusterEmissions(clusters, collector.finish(theta));
    },
  };
}

/**
 * Adds log(P(t | class, bit string of `word`) / P̂(t | class)) to row[offset..offset+K) when
 * `symbol` is a word-class symbol (unknown or rare word) and the clustering knows the word; does
 * nothing for a known word, an unclustered word or a model without clusters (`emissions` null).
 */
export function addClusterLogRatio(
  emissions: ClusterEmissions | null,
  vocabulary: Vocabulary,
  word: string,
  firstInSentence: boolean,
  symbol: number,
  row: Float64Array,
  offset: number,
): void {
  if (emissions === null || symbol < vocabulary.words.length) return;
  const c = clusterOf(emissions.clusters, word);
  if (c < 0) return;
  const { ratio, scratch, statistics } = emissions;
  suffixLogRatio(statistics, emissions.reversedPaths[c], suffixGroupOf(vocabulary, word, firstInSentence), ratio, scratch);
  for (let k = 0; k < statistics.states; k++) row[offset + k] += ratio[k];
}
