/**
 * Word-feature classes for words the model has not learned individually (unknown or rare words).
 *
 * `bikel`: the feature set of Bikel, Miller, Schwartz & Weischedel (1997), "Nymble: a
 * high-performance learning name-finder", ANLP, §3.3 (table of word features), in its order of
 * precedence: twoDigitNum, fourDigitNum, containsDigitAndAlpha, containsDigitAndDash,
 * containsDigitAndSlash, containsDigitAndComma, containsDigitAndPeriod, otherNum, allCaps,
 * capPeriod, firstWord, initCap, lowerCase, other. (The list and its order are from memory of the
 * paper's table.)
 *
 * `extended`: the same tests, but the first word of a sentence keeps its capitalisation class
 * (firstWord+initCap, firstWord+lowerCase, …) instead of losing it, punctuation is split from
 * other symbols, and capitalised words with a hyphen or an inner capital get their own classes.
 * Not from a paper: common practice in later feature-based NER, chosen by cross-validation here.
 */
export type WordClassScheme = "bikel" | "extended";

const BIKEL_CLASSES = [
  "twoDigitNum",
  "fourDigitNum",
  "containsDigitAndAlpha",
  "containsDigitAndDash",
  "containsDigitAndSlash",
  "containsDigitAndComma",
  "containsDigitAndPeriod",
  "otherNum",
  "allCaps",
  "capPeriod",
  "firstWord",
  "initCap",
  "lowerCase",
  "other",
] as const;

const EXTENDED_BASE = [
  "twoDigitNum",
  "fourDigitNum",
  "containsDigitAndAlpha",
  "containsDigitAndDash",
  "containsDigitAndSlash",
  "containsDigitAndComma",
  "containsDigitAndPeriod",
  "otherNum",
  "allCaps",
  "capPeriod",
  "initCapHyphen",
  "mixedCaps",
  "initCap",
  "lowerCaseHyphen",
  "lowerCase",
  "punctuation",
  "other",
] as const;

const EXTENDED_CLASSES = [...EXTENDED_BASE, ...EXTENDED_BASE.map((name) => `firstWord+${name}`)];

/** The class names of a scheme; a class id indexes this list. */
export function wordClassNames(scheme: WordClassScheme): readonly string[] {
  return scheme === "bikel" ? BIKEL_CLASSES : EXTENDED_CLASSES;
}

const DIGIT = /\p{Nd}/u;
const ALL_DIGITS = /^\p{Nd}+$/u;
const LETTER = /\p{L}/u;
const UPPER_START = /^\p{Lu}/u;
const ALL_UPPER_LETTERS = /^[\p{Lu}\p{Lt}]+$/u;
const CAP_PERIOD = /^\p{Lu}\.$/u;
const LOWER_START = /^\p{Ll}/u;
const INNER_UPPER = /^.\p{Ll}*\p{Lu}/u;
const PUNCTUATION = /^[\p{P}\p{S}]+$/u;

/** Name of the Bikel et al. (1997) feature of a word (without the firstWord rule). */
function baseFeature(word: string, scheme: WordClassScheme): string {
  if (DIGIT.test(word)) {
    if (ALL_DIGITS.test(word)) {
      if (word.length === 2) return "twoDigitNum";
      if (word.length === 4) return "fourDigitNum";
      return "otherNum";
    }
    if (LETTER.test(word)) return "containsDigitAndAlpha";
    if (word.includes("-")) return "containsDigitAndDash";
    if (word.includes("/")) return "containsDigitAndSlash";
    if (word.includes(",")) return "containsDigitAndComma";
    if (word.includes(".")) return "containsDigitAndPeriod";
    return "otherNum";
  }
  if (ALL_UPPER_LETTERS.test(word)) return word.length === 1 && scheme === "extended" ? "initCap" : "allCaps";
  if (CAP_PERIOD.test(word)) return "capPeriod";
  if (UPPER_START.test(word)) {
    if (scheme === "extended") {
      if (word.includes("-")) return "initCapHyphen";
      if (INNER_UPPER.test(word)) return "mixedCaps";
    }
    return "initCap";
  }
  if (LOWER_START.test(word)) return scheme === "extended" && word.includes("-") ? "lowerCaseHyphen" : "lowerCase";
  if (scheme === "extended" && PUNCTUATION.test(word)) return "punctuation";
  return "other";
}

/**
 * The class id of a word in its sentence position (`firstInSentence` for token 0), per scheme.
 * In `bikel`, a first word that is not a number, all-caps or an initial is `firstWord` (its
 * capital letter says nothing); `extended` keeps the word's own class under a firstWord+ prefix.
 */
export function wordClassOf(word: string, firstInSentence: boolean, scheme: WordClassScheme): number {
  const base = baseFeature(word, scheme);
  if (scheme === "bikel") {
    return BIKEL_INDEX.get(firstInSentence && !BEFORE_FIRST_WORD.has(base) ? "firstWord" : base) as number;
  }
  return EXTENDED_INDEX.get(firstInSentence ? `firstWord+${base}` : base) as number;
}

const BIKEL_INDEX = new Map<string, number>(BIKEL_CLASSES.map((name, i) => [name, i]));
const EXTENDED_INDEX = new Map<string, number>(EXTENDED_CLASSES.map((name, i) => [name, i]));
/** Features that take precedence over firstWord in Bikel et al.'s ordering. */
const BEFORE_FIRST_WORD = new Set<string>(BIKEL_CLASSES.slice(0, BIKEL_CLASSES.indexOf("firstWord")));

/** True when a word starts with an upper-case letter (used to split suffix statistics). */
export function isCapitalized(word: string): boolean {
  return UPPER_START.test(word);
}
