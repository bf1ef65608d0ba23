import type { TrainingConfig } from "./training-config";
import { isCapitalized, wordClassNames, wordClassOf } from "./word-features";

/**
 * The edge between strings and ids. Symbols 0..V-1 are the known words; V..V+C-1 are the
 * word classes that stand for unknown and rare words (one `<unk>` class when word classes are off).
 */
export type Vocabulary = {
  /** Known words in id order. */
  readonly words: readonly string[];
  /** Class names; class c is symbol words.length + c. */
  readonly classes: readonly string[];
  readonly scheme: TrainingConfig["wordClasses"];
  /** An unknown sentence-initial word is read as its form with a lower-case first letter when that form is known. */
  readonly lowercaseFirstWord: boolean;
  /** Lookup built from `words` (not serialized). */
  readonly index: ReadonlyMap<string, number>;
};

/** Number of symbols V + C. */
export function symbolCount(vocabulary: Vocabulary): number {
  return vocabulary.words.length + vocabulary.classes.length;
}

/** Builds the vocabulary: words seen more than `rare` times, in first-seen order. */
export function buildVocabulary(wordCounts: ReadonlyMap<string, number>, rare: number, scheme: TrainingConfig["wordClasses"], lowercaseFirstWord: boolean): Vocabulary {
  const words: string[] = [];
  for (const [word, count] of wordCounts) if (count > rare) words.push(word);
  return createVocabulary(words, scheme, lowercaseFirstWord);
}

/** A vocabulary from its word list (as stored in a serialized model). */
export function createVocabulary(words: readonly string[], scheme: TrainingConfig["wordClasses"], lowercaseFirstWord: boolean): Vocabulary {
  const index = new Map<string, number>();
  words.forEach((w, i) => index.set(w, i));
  if (index.size !== words.length) throw new RangeError("vocabulary words must be distinct");
  return { words, classes: scheme === "none" ? ["<unk>"] : wordClassNames(scheme), scheme, lowercaseFirstWord, index };
}

/** Class id (not symbol) of a word at a sentence position. */
export function classOf(vocabulary: Vocabulary, word: string, firstInSentence: boolean): number {
  return vocabulary.scheme === "none" ? 0 : wordClassOf(word, firstInSentence, vocabulary.scheme);
}

/**
 * Symbol of a word at a sentence position: its own id if known; for an unknown sentence-initial
 * word (when enabled), the id of the same word with a lower-case first letter ("However" →
 * "however": capitalisation there is positional, common practice in taggers); else its class.
 */
export function symbolOf(vocabulary: Vocabulary, word: string, firstInSentence: boolean): number {
  const id = vocabulary.index.get(word);
  if (id !== undefined) return id;
  if (firstInSentence && vocabulary.lowercaseFirstWord) {
    const lower = vocabulary.index.get(word.charAt(0).toLowerCase() + word.slice(1));
    if (lower !== undefined) return lower;
  }
  return vocabulary.words.length + classOf(vocabulary, word, firstInSentence);
}

/**
 * Which suffix table an unknown word's suffix statistics come from: its word class, or its
 * capitalisation when word classes are off (Brants 2000 §2.3 keeps separate suffix tries for
 * capitalised and uncapitalised words).
 */
export function suffixGroupOf(vocabulary: Vocabulary, word: string, firstInSentence: boolean): number {
  return vocabulary.scheme === "none" ? (isCapitalized(word) ? 1 : 0) : classOf(vocabulary, word, firstInSentence);
}

/** Encodes the words of one sentence as symbols (a new Int32Array). */
export function encodeWords(vocabulary: Vocabulary, words: readonly string[]): Int32Array {
  const out = new Int32Array(words.length);
  for (let t = 0; t < words.length; t++) out[t] = symbolOf(vocabulary, words[t], t === 0);
  return out;
}
