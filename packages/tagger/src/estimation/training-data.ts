import { isIobTag, toIob2 } from "../text/bio";
import type { ColumnDocument, TagScheme } from "../text/conll";
import { segmentStartTable } from "./context-emissions";
import { sentenceBucketCount, bucketCount } from "./position-buckets";
import { createSuffixCollector, suffixTheta, type SuffixStatistics } from "./suffix-model";
import { countSupervised, type EncodedCorpus } from "./train";
import type { SufficientStatistics } from "./sufficient-statistics";
import type { TrainingConfig } from "./training-config";
import type { DataSummary } from "../model/tagger-model";
import { buildVocabulary, suffixGroupOf, symbolCount, symbolOf, type Vocabulary } from "./vocabulary";
import { learnBrownClusters } from "./brown-clusters";
import { CLUSTER_THETA, createClusterCollector, type ClusterEmissions } from "./cluster-emissions";

/** The labelled data mapped to ids, with everything counted from it. */
export type PreparedTrainingData = {
  readonly scheme: TagScheme;
  readonly tags: readonly string[];
  readonly vocabulary: Vocabulary;
  readonly corpus: EncodedCorpus;
  readonly statistics: SufficientStatistics;
  readonly suffix: SuffixStatistics | null;
  /** Word clusters and their emission statistics when config.clusters > 0, else null. */
  readonly clusters: ClusterEmissions | null;
  readonly summary: DataSummary;
};

/** `iob` when every tag is O, B-X or I-X, else `plain` (unless the config forces a scheme). */
export function detectScheme(documents: readonly ColumnDocument[], requested: TrainingConfig["scheme"]): TagScheme {
  if (requested === "plain") return "plain";
  if (requested === "iob") return "iob";
  for (const doc of documents) for (const s of doc.sentences) for (const tag of s.tags) if (!isIobTag(tag)) return "plain";
  return "iob";
}

/**
 * Maps labelled documents to ids and counts them. Tags of the iob scheme are rewritten as IOB2
 * (IOB1 input reads the same way under the CoNLL convention), except in the NLTK-compatible
 * configuration, which trains on the tags as written, as NLTK does. States are numbered in order of
 * first appearance, which is also how NLTK numbers them (its decoder breaks ties toward the
 * state seen first). Throws RangeError for an empty corpus or a sentence whose words and tags
 * differ in length.
 */
export function prepareTrainingData(
  documents: readonly ColumnDocument[],
  config: TrainingConfig,
  /** Unlabelled sentences that join the training text in the word clustering (config.clusters > 0). */
  unlabelled: readonly (readonly string[])[] = [],
): PreparedTrainingData {
  const scheme = detectScheme(documents, config.scheme);
  const sentences: { words: readonly string[]; tags: readonly string[]; index: number }[] = [];
  documents.forEach((doc, d) =>
    doc.sentences.forEach((s, i) => {
      if (s.words.length !== s.tags.length) throw new RangeError(`document ${d} sentence ${i}: ${s.words.length} words but ${s.tags.length} tags`);
      if (s.words.length > 0) sentences.push({ words: s.words, tags: scheme === "iob" && !config.nltkCompatible ? toIob2(s.tags) : s.tags, index: i });
    }),
  );
  if (sentences.length === 0) throw new RangeError("no labelled tokens to train on");

  const tagIndex = new Map<string, number>();
  const wordCounts = new Map<string, number>();
  let tokens = 0;
  for (const s of sentences) {
    for (let t = 0; t < s.words.length; t++) {
      if (!tagIndex.has(s.tags[t])) tagIndex.set(s.tags[t], tagIndex.size);
      wordCounts.set(s.words[t], (wordCounts.get(s.words[t]) ?? 0) + 1);
    }
    tokens += s.words.length;
  }
  const tags = [...tagIndex.keys()];
  const K = tags.length;
  const vocabulary = buildVocabulary(wordCounts, config.rare, config.wordClasses, config.lowercaseFirstWord);

  const symbols = new Int32Array(tokens);
  const tagIds = new Int32Array(tokens);
  const sentenceStarts = new Int32Array(sentences.length + 1);
  const sentenceIndex = new Int32Array(sentences.length);
  const suffixCollector = config.suffixLength > 0 ? createSuffixCollector(K, config.suffixLength) : null;
  const tagCounts = new Float64Array(K);
  const clusterCollector =
    config.clusters > 0 ? createClusterCollector(learnBrownClusters([...sentences.map((s) => s.words), ...unlabelled], { clusters: config.clusters }), K) : null;
  let n = 0;
  sentences.forEach((s, k) => {
    sentenceIndex[k] = s.index;
    for (let t = 0; t < s.words.length; t++, n++) {
      const word = s.words[t];
      const tag = tagIndex.get(s.tags[t])!;
      symbols[n] = symbolOf(vocabulary, word, t === 0);
      tagIds[n] = tag;
      tagCounts[tag]++;
      if (suffixCollector !== null && wordCounts.get(word)! <= config.suffixMaxFrequency) {
        suffixCollector.add(word, suffixGroupOf(vocabulary, word, t === 0), tag);
      }
      if (clusterCollector !== null && wordCounts.get(word)! <= config.suffixMaxFrequency) clusterCollector.add(word, suffixGroupOf(vocabulary, word, t === 0), tag);
    }
    sentenceStarts[k + 1] = n;
  });
  const corpus: EncodedCorpus = { symbols, tags: tagIds, sentenceStarts, sentenceIndex };
  const statistics = countSupervised(corpus, {
    states: K,
    symbols: symbolCount(vocabulary),
    positionBuckets: config.positionBuckets,
    prevWord: config.prevWord,
    trigrams: config.order === 2,
    segmentStarts: config.contextEmissions ? segmentStartTable(tags, scheme) : null,
  });
  if (statistics.buckets !== bucketCount(config.positionBuckets) || statistics.sentenceBuckets !== sentenceBucketCount(config.positionBuckets)) {
    throw new RangeError("prepareTrainingData: bucket shape mismatch");
  }
  const summary: DataSummary = {
    documents: documents.length,
    sentences: sentences.length,
    tokens,
    tagCounts: Object.fromEntries(tags.map((tag, k) => [tag, tagCounts[k]])),
    unlabelledDocuments: 0,
    unlabelledSentences: 0,
    unlabelledTokens: 0,
  };
  return {
    scheme,
    tags,
    vocabulary,
    corpus,
    statistics,
    suffix: suffixCollector === null ? null : suffixCollector.finish(config.suffixTheta ?? suffixTheta(tagCounts)),
    clusters: clusterCollector === null ? null : clusterCollector.finish(CLUSTER_THETA),
    summary,
  };
}
