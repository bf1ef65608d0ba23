import { isIobTag, toIob2 } from "../text/bio";
import type { ColumnDocument, TagScheme } from "../text/conll";
import { segmentStartTable } from "./context-emissions";
import { addCount, createCountTable, type CountTable } from "./count-table";
import { createSuffixCollector, suffixTheta } from "./suffix-model";
import { addStatistics, type SufficientStatistics } from "./sufficient-statistics";
import { fitSpanCalibration } from "../model/tagger";
import { assembleModel, type TaggerModel } from "../model/tagger-model";
import { countSupervised } from "./train";
import { resolveTrainingConfig, type TrainingConfig } from "./training-config";
import { buildVocabulary, suffixGroupOf, symbolCount, symbolOf, type Vocabulary } from "./vocabulary";

// Training split into shards (DESIGN.md, "Scale"): the documents are cut into contiguous slices,
// each counted on its own, and the counts summed. Two passes, because the vocabulary (words seen
// more than `rare` times) and the tag numbering depend on the whole corpus: pass 1 counts words and
// tags per shard, the plan merges them, pass 2 counts the statistics with the plan. Every count is
// an integer, so the sums are exact, and every table keeps first-seen order when merged in shard
// order: the model equals trainTagger's on the concatenated documents byte for byte.

/** Pass 1 of one shard: word and tag counts in first-seen order (JSON-safe). */
export type ShardWordCounts = {
  readonly words: [string, number][];
  /** Tags as IOB2 (when every tag of the shard is O, B-X or I-X) in first-seen order. */
  readonly tags: string[];
  /** Tags as written, in first-seen order (the plain scheme). */
  readonly rawTags: string[];
  /** False when some tag is not O, B-X or I-X. */
  readonly allIob: boolean;
};

/** What pass 2 needs from the whole corpus (JSON-safe): merge of every shard's word counts. */
export type ShardPlan = { readonly scheme: TagScheme; readonly tags: string[]; readonly words: [string, number][] };

/** Pass 2 of one shard: its sufficient statistics and the inputs of the suffix model (JSON-safe). */
export type ShardCounts = {
  readonly statistics: SerializedStatistics;
  /** (suffix group, word, tag id, count) in first-seen order, for words rare enough to feed suffixes. */
  readonly suffixes: [number, string, number, number][];
  readonly tagCounts: number[];
  readonly documents: number;
  readonly sentences: number;
  readonly tokens: number;
};

type SerializedTable = { keys: number[]; values: number[] } | null;
/** Sufficient statistics as plain arrays, entries of the sparse tables in insertion order. */
export type SerializedStatistics = {
  states: number;
  symbols: number;
  buckets: number;
  sentenceBuckets: number;
  start: number[];
  transitions: number[];
  end: number[];
  emissions: number[];
  prevWord: SerializedTable;
  trigrams: SerializedTable;
  contextEmissions: SerializedTable;
  tokens: number;
  sentences: number;
};

function resolve(config: Partial<TrainingConfig>): TrainingConfig {
  if (config.nltkCompatible === true) throw new RangeError("sharded training does not support the NLTK-compatible configuration");
  // Clustering needs the bigrams of the whole text at once, which shards do not share.
  if (config.clusters !== undefined && config.clusters > 0) throw new RangeError("sharded training does not support word clusters (clusters must be 0)");
  return resolveTrainingConfig(config);
}

/** Pass 1: word and tag counts of one shard's documents. */
export function countShardWords(documents: readonly ColumnDocument[]): ShardWordCounts {
  const words = new Map<string, number>();
  const tags = new Set<string>();
  const rawTags = new Set<string>();
  let allIob = true;
  for (const doc of documents) {
    for (const s of doc.sentences) {
      if (s.words.length !== s.tags.length) throw new RangeError(`sentence has ${s.words.length} words but ${s.tags.length} tags`);
      for (const tag of s.tags) if (!isIobTag(tag)) allIob = false;
    }
  }
  for (const doc of documents) {
    for (const s of doc.sentences) {
      const written = allIob ? toIob2(s.tags) : s.tags;
      for (let t = 0; t < s.words.length; t++) {
        words.set(s.words[t], (words.get(s.words[t]) ?? 0) + 1);
        tags.add(written[t]);
        rawTags.add(s.tags[t]);
      }
    }
  }
  return { words: [...words], tags: [...tags], rawTags: [...rawTags], allIob };
}

/** Merges pass-1 counts given in shard order into the plan of pass 2 (first-seen order kept). */
export function planShards(parts: readonly ShardWordCounts[], config: Partial<TrainingConfig> = {}): ShardPlan {
  const resolved = resolve(config);
  const allIob = parts.every((p) => p.allIob);
  const scheme: TagScheme = resolved.scheme === "plain" ? "plain" : resolved.scheme === "iob" ? "iob" : allIob ? "iob" : "plain";
  const words = new Map<string, number>();
  const tags = new Set<string>();
  for (const p of parts) {
    for (const [w, n] of p.words) words.set(w, (words.get(w) ?? 0) + n);
    for (const t of scheme === "iob" ? p.tags : p.rawTags) tags.add(t);
  }
  if (tags.size === 0) throw new RangeError("no labelled tokens to train on");
  // A forced iob scheme over tags that are not O, B-X or I-X is refused (trainTagger would
  // rewrite them in a way the shards cannot reproduce).
  if (scheme === "iob" && !allIob) throw new RangeError("the iob scheme needs O, B-X or I-X tags in every shard");
  return { scheme, tags: [...tags], words: [...words] };
}

function vocabularyOf(plan: ShardPlan, config: TrainingConfig): Vocabulary {
  return buildVocabulary(new Map(plan.words), config.rare, config.wordClasses, config.lowercaseFirstWord);
}

/** Pass 2: the statistics of one shard under the plan. */
export function countShard(documents: readonly ColumnDocument[], plan: ShardPlan, config: Partial<TrainingConfig> = {}): ShardCounts {
  const resolved = resolve(config);
  const vocabulary = vocabularyOf(plan, resolved);
  const wordCounts = new Map(plan.words);
  const tagIndex = new Map(plan.tags.map((t, k) => [t, k]));
  const K = plan.tags.length;
  const symbolsList: number[] = [];
  const tagList: number[] = [];
  const sentenceStarts: number[] = [0];
  const sentenceIndex: number[] = [];
  const tagCounts = new Array<number>(K).fill(0);
  const suffixes = new Map<string, [number, string, number, number]>();
  let sentences = 0;
  for (const doc of documents) {
    doc.sentences.forEach((s, i) => {
      if (s.words.length === 0) return;
      const tags = plan.scheme === "iob" ? toIob2(s.tags) : s.tags;
      for (let t = 0; t < s.words.length; t++) {
        const word = s.words[t];
        const tag = tagIndex.get(tags[t]);
        if (tag === undefined) throw new RangeError(`tag ${tags[t]} is not in the plan`);
        symbolsList.push(symbolOf(vocabulary, word, t === 0));
        tagList.push(tag);
        tagCounts[tag]++;
        if (resolved.suffixLength > 0 && (wordCounts.get(word) ?? 0) <= resolved.suffixMaxFrequency) {
          const group = suffixGroupOf(vocabulary, word, t === 0);
          const key = `${group}\u0000${tag}\u0000${word}`;
          const entry = suffixes.get(key);
          if (entry) entry[3]++;
          else suffixes.set(key, [group, word, tag, 1]);
        }
      }
      sentenceIndex.push(i);
      sentenceStarts.push(symbolsList.length);
      sentences++;
    });
  }
  const statistics = countSupervised(
    { symbols: Int32Array.from(symbolsList), tags: Int32Array.from(tagList), sentenceStarts: Int32Array.from(sentenceStarts), sentenceIndex: Int32Array.from(sentenceIndex) },
    {
      states: K,
      symbols: symbolCount(vocabulary),
      positionBuckets: resolved.positionBuckets,
      prevWord: resolved.prevWord,
      trigrams: resolved.order === 2,
      segmentStarts: resolved.contextEmissions ? segmentStartTable(plan.tags, plan.scheme) : null,
    },
  );
  return { statistics: statisticsToJson(statistics), suffixes: [...suffixes.values()], tagCounts, documents: documents.length, sentences, tokens: symbolsList.length };
}

/** The summed statistics of shards given in shard order (a new object). */
export function sumShardStatistics(shards: readonly ShardCounts[]): SufficientStatistics {
  if (shards.length === 0) throw new RangeError("no shards to sum");
  let total = statisticsFromJson(shards[0].statistics);
  for (let i = 1; i < shards.length; i++) total = addStatistics(total, statisticsFromJson(shards[i].statistics));
  return total;
}

/**
 * Two shards' counts as one (a before b in shard order), so that a caller can fold shards in one
 * at a time instead of holding them all: folding in order gives trainFromShards the same input
 * as the whole list, and the same model.
 */
export function mergeShardCounts(a: ShardCounts, b: ShardCounts): ShardCounts {
  const suffixes = new Map<string, [number, string, number, number]>();
  for (const list of [a.suffixes, b.suffixes]) {
    for (const [group, word, tag, count] of list) {
      const key = `${group}\u0000${tag}\u0000${word}`;
      const entry = suffixes.get(key);
      if (entry) entry[3] += count;
      else suffixes.set(key, [group, word, tag, count]);
    }
  }
  return {
    statistics: statisticsToJson(addStatistics(statisticsFromJson(a.statistics), statisticsFromJson(b.statistics))),
    suffixes: [...suffixes.values()],
    tagCounts: a.tagCounts.map((n, k) => n + b.tagCounts[k]),
    documents: a.documents + b.documents,
    sentences: a.sentences + b.sentences,
    tokens: a.tokens + b.tokens,
  };
}

/**
 * Estimates the model from shards counted with `plan` (smoothing and the suffix model), as
 * trainTagger would from the concatenated documents. Returns the summed statistics too, for
 * refineWithUnlabelled.
 */
export function trainFromShards(
  plan: ShardPlan,
  shards: readonly ShardCounts[],
  config: Partial<TrainingConfig> = {},
  /** The training documents in shard order: the span-confidence calibration is fitted on them as trainTagger does. */
  calibrationDocuments: readonly ColumnDocument[] = [],
): { model: TaggerModel; statistics: SufficientStatistics } {
  const resolved = resolve(config);
  const calibration =
    resolved.calibration !== "none" && plan.scheme === "iob" && !resolved.nltkCompatible && calibrationDocuments.length > 0
      ? fitSpanCalibration(calibrationDocuments, resolved)
      : null;
  const vocabulary = vocabularyOf(plan, resolved);
  const statistics = sumShardStatistics(shards);
  const K = plan.tags.length;
  const tagCounts = new Float64Array(K);
  for (const s of shards) for (let k = 0; k < K; k++) tagCounts[k] += s.tagCounts[k];
  let suffix = null;
  if (resolved.suffixLength > 0) {
    const collector = createSuffixCollector(K, resolved.suffixLength);
    for (const s of shards) for (const [group, word, tag, count] of s.suffixes) collector.add(word, group, tag, count);
    suffix = collector.finish(resolved.suffixTheta ?? suffixTheta(tagCounts));
  }
  const model = assembleModel({
    calibration,
    config: resolved,
    scheme: plan.scheme,
    tags: plan.tags,
    vocabulary,
    statistics,
    suffix,
    summary: {
      documents: shards.reduce((n, s) => n + s.documents, 0),
      sentences: shards.reduce((n, s) => n + s.sentences, 0),
      tokens: shards.reduce((n, s) => n + s.tokens, 0),
      tagCounts: Object.fromEntries(plan.tags.map((tag, k) => [tag, tagCounts[k]])),
      unlabelledDocuments: 0,
      unlabelledSentences: 0,
      unlabelledTokens: 0,
    },
  });
  return { model, statistics };
}

const tableToJson = (t: CountTable | null): SerializedTable =>
  t === null ? null : { keys: Array.from(t.keys.subarray(0, t.size)), values: Array.from(t.values.subarray(0, t.size)) };
function tableFromJson(t: SerializedTable): CountTable | null {
  if (t === null) return null;
  const table = createCountTable(t.keys.length);
  for (let i = 0; i < t.keys.length; i++) addCount(table, t.keys[i], t.values[i]);
  return table;
}

/** Sufficient statistics as plain arrays (exact: JSON numbers round-trip doubles). */
export function statisticsToJson(s: SufficientStatistics): SerializedStatistics {
  return {
    states: s.states,
    symbols: s.symbols,
    buckets: s.buckets,
    sentenceBuckets: s.sentenceBuckets,
    start: Array.from(s.start),
    transitions: Array.from(s.transitions),
    end: Array.from(s.end),
    emissions: Array.from(s.emissions),
    prevWord: tableToJson(s.prevWord),
    trigrams: tableToJson(s.trigrams),
    contextEmissions: tableToJson(s.contextEmissions),
    tokens: s.tokens,
    sentences: s.sentences,
  };
}

export function statisticsFromJson(s: SerializedStatistics): SufficientStatistics {
  return {
    states: s.states,
    symbols: s.symbols,
    buckets: s.buckets,
    sentenceBuckets: s.sentenceBuckets,
    start: Float64Array.from(s.start),
    transitions: Float64Array.from(s.transitions),
    end: Float64Array.from(s.end),
    emissions: Float64Array.from(s.emissions),
    prevWord: tableFromJson(s.prevWord),
    trigrams: tableFromJson(s.trigrams),
    contextEmissions: tableFromJson(s.contextEmissions),
    tokens: s.tokens,
    sentences: s.sentences,
  };
}
