/**
 * Features of a word type for the averaged perceptron (perceptron.ts). Collins (2002),
 * "Discriminative training methods for hidden Markov models", §2 and §3, lets the perceptron score
 * arbitrary features of the word and its tag, and takes his part-of-speech templates from
 * Ratnaparkhi (1996), "A maximum entropy model for part-of-speech tagging", EMNLP, Table 1 / §3:
 * the word itself, its prefixes and suffixes of up to 4 characters, and whether it contains a
 * number, an upper-case character or a hyphen. Only templates of the word itself are kept here
 * (none of its neighbours), so the weights of a word type add one fixed row to its emission
 * scores, which the tagging path caches per word type. Besides Ratnaparkhi's: the word shape
 * (common practice in later feature-based taggers), the word-feature class of word-features.ts
 * (with the classes for informal text) and, when the model has word clusters, prefixes of the
 * word's bit string (Miller, Guinness & Zamanian 2004, §3, give a name tagger cluster prefixes as
 * features).
 *
 * Each feature is a string; a {@link FeatureWeights} table interns the strings seen in training
 * into ids and holds one weight per (feature, tag) in a typed array. Each feature is conjoined
 * with whether the model knows the word (its own symbol) or reads it by its word class (an
 * unknown or rare word), {@link featureKey}: the base scores of the two kinds of word differ in
 * kind (counts of the word against class and suffix statistics), and the perceptron's training
 * scores each sentence with a model that did not count it, where far more of the words are
 * unknown than on the training text itself; conjoined, a word's weights learnt while it was
 * unknown to that model do not add to the counts the full model has of it (Ratnaparkhi 1996 §3
 * likewise gives spelling features to rare words only).
 */
import { clusterOf, type WordClusters } from "./brown-clusters";
import { wordClassNames, wordClassOf } from "./word-features";

/** Longest prefix and suffix (Ratnaparkhi 1996 §3: up to 4 characters). */
export const AFFIX_LENGTH = 4;
/** Runs of one shape character longer than this are cut to it ("Velmora" → "Xxxxx"). */
export const SHAPE_RUN = 4;

function shapeChar(c: string): string {
  if (/\p{Lu}|\p{Lt}/u.test(c)) return "X";
  if (/\p{L}/u.test(c)) return "x";
  if (/\p{Nd}/u.test(c)) return "d";
  return c;
}

/**
 * The shape of a word: upper-case letters X, other letters x, digits d, any other character
 * itself, each run of one shape character cut to SHAPE_RUN ("Velmora" → "Xxxxx", "ab" → "xx",
 * "1990" → "dddd", "M.K." → "X.X.").
 */
export function wordShape(word: string): string {
  let out = "";
  let last = "";
  let run = 0;
  for (const c of word) {
    const s = shapeChar(c);
    run = s === last ? run + 1 : 1;
    last = s;
    if (run <= SHAPE_RUN) out += s;
  }
  return out;
}

const DIGIT = /\p{Nd}/u;
const UPPER_INSIDE = /^.+[\p{Lu}\p{Lt}]/su;

/**
 * The feature strings of a word type at a sentence position (`first`: token 0), in this order:
 * `lower=` the lower-cased form; `prefix=` and `suffix=` of the lower-cased form, 1 to
 * AFFIX_LENGTH characters (code points) and shorter than the word; `shape=`; `class=` the
 * informal word class (whose first-word variants carry the position); `digit`, `hyphen`,
 * `upper-inside` when the word has one (an upper-case letter after its first character); with
 * clusters, `cluster=` prefixes of the word's bit string of lengths 2, 4, 6, … and the whole string.
 */
export function wordTypeFeatures(word: string, first: boolean, clusters: WordClusters | null): string[] {
  const lower = word.toLowerCase();
  const chars = Array.from(lower);
  const out = [`lower=${lower}`];
  const n = Math.min(AFFIX_LENGTH, chars.length - 1);
  for (let i = 1; i <= n; i++) out.push(`prefix=${chars.slice(0, i).join("")}`);
  for (let i = 1; i <= n; i++) out.push(`suffix=${chars.slice(chars.length - i).join("")}`);
  out.push(`shape=${wordShape(word)}`, `class=${wordClassNames("informal")[wordClassOf(word, first, "informal")]}`);
  if (DIGIT.test(word)) out.push("digit");
  if (word.includes("-")) out.push("hyphen");
  if (UPPER_INSIDE.test(word)) out.push("upper-inside");
  if (clusters !== null) {
    const c = clusterOf(clusters, word);
    if (c >= 0) {
      const path = clusters.paths[c];
      for (let i = 2; i < path.length; i += 2) out.push(`cluster=${path.slice(0, i)}`);
      out.push(`cluster=${path}`);
    }
  }
  return out;
}

/** The table key of feature `name` for a word the model knows (`known`) or reads by its class. */
export function featureKey(name: string, known: boolean): string {
  return known ? `known:${name}` : `class:${name}`;
}

/** Word types whose summed rows are kept per table before the cache starts afresh. */
const ROW_CACHE_LIMIT = 1 << 16;

/**
 * Interned features and their weights: feature f's weight for tag k is weights[f·K + k]. The row
 * cache (word type and position → summed weights) is not serialized.
 */
export type FeatureWeights = {
  readonly states: number;
  /** Feature strings in id order. */
  readonly names: readonly string[];
  readonly index: ReadonlyMap<string, number>;
  readonly weights: Float64Array;
  readonly rows: Map<string, Float64Array>;
};

/** A table from its feature names and F×K weights (throws RangeError on a mismatch). */
export function createFeatureWeights(names: readonly string[], weights: Float64Array, states: number): FeatureWeights {
  if (weights.length !== names.length * states) throw new RangeError(`feature weights: ${weights.length} weights for ${names.length} features × ${states} tags`);
  const index = new Map<string, number>();
  names.forEach((name, f) => index.set(name, f));
  if (index.size !== names.length) throw new RangeError("feature weights: feature names must be distinct");
  return { states, names, index, weights, rows: new Map() };
}

/** Ids of a word's features (keyed by `known`, see featureKey) that the table has, in wordTypeFeatures order. */
export function knownFeatureIds(table: FeatureWeights, word: string, first: boolean, known: boolean, clusters: WordClusters | null): number[] {
  const ids: number[] = [];
  for (const name of wordTypeFeatures(word, first, clusters)) {
    const f = table.index.get(featureKey(name, known));
    if (f !== undefined) ids.push(f);
  }
  return ids;
}

/**
 * Adds the sum of a word type's feature weights, per tag, to row[offset..offset+K): the sum is
 * formed first (features in order, from 0) and then added, as the perceptron's training does.
 * `known`: the word has its own symbol in the model. Sums are cached by word, position and kind.
 */
export function addFeatureWeights(table: FeatureWeights, clusters: WordClusters | null, word: string, first: boolean, known: boolean, row: Float64Array, offset: number): void {
  const key = `${first ? 1 : 0}${known ? 1 : 0}${word}`;
  let sum = table.rows.get(key);
  if (sum === undefined) {
    const K = table.states;
    sum = new Float64Array(K);
    for (const f of knownFeatureIds(table, word, first, known, clusters)) for (let k = 0; k < K; k++) sum[k] += table.weights[f * K + k];
    if (table.rows.size >= ROW_CACHE_LIMIT) table.rows.clear();
    table.rows.set(key, sum);
  }
  for (let k = 0; k < table.states; k++) row[offset + k] += sum[k];
}
