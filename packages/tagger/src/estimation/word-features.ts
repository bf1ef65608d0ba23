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
 *
 * `informal`: `extended` with classes for text from chats, tickets and posts, tested before the
 * others (each keeps the firstWord+ prefix):
 * - `url`, `handle` (@name), `hashtag` (#name): Ritter, Clark, Mausam & Etzioni (2011), "Named
 *   Entity Recognition in Tweets: An Experimental Study", EMNLP, §2.1, add tags for retweets,
 *   @usernames, #hashtags and URLs to their Twitter part-of-speech tagger (from memory);
 * - `email` and `emoticon` (emoji and ASCII faces such as ":-)"): Gimpel et al. (2011),
 *   "Part-of-Speech Tagging for Twitter: Annotation, Features, and Experiments", ACL, whose tag
 *   set has URL/email and emoticon tags and whose features include regular expressions for them
 *   (from memory);
 * - `elongatedLower` / `elongatedCap` (a letter three or more times in a row, "sooo", "Yesss"):
 *   Brody & Diakopoulos (2011), "Cooooooooooooooollllllllllllll!!!!!!!!!!!!!! Using Word
 *   Lengthening to Detect Sentiment in Microblogs", EMNLP (from memory: lengthening is common
 *   in microblogs and marks a word as informal);
 * - `lowerCaseDigit` (letters and digits starting lower case, "gr8", "b4", "iphone5") apart from
 *   other letter–digit mixes (not from a paper; chosen by cross-validation). All-lower-case words
 *   keep `lowerCase`: lower-case names in such text are told apart by context and suffix.
 */
export type WordClassScheme = "bikel" | "extended" | "informal";

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

const INFORMAL_BASE = ["url", "email", "handle", "hashtag", "emoticon", "elongatedLower", "elongatedCap", "lowerCaseDigit", ...EXTENDED_BASE] as const;

const INFORMAL_CLASSES = [...INFORMAL_BASE, ...INFORMAL_BASE.map((name) => `firstWord+${name}`)];

/** The class names of a scheme; a class id indexes this list. */
export function wordClassNames(scheme: WordClassScheme): readonly string[] {
  return scheme === "bikel" ? BIKEL_CLASSES : scheme === "extended" ? EXTENDED_CLASSES : INFORMAL_CLASSES;
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

const URL = /^(?:[a-z][a-z0-9+.-]*:\/\/|www\.)\S+$/iu;
const EMAIL = /^[^@\s]+@[^@\s]+\.\p{L}{2,}$/u;
const HANDLE = /^@[\p{L}\p{N}_]+$/u;
const HASHTAG = /^#[\p{L}\p{N}_]*\p{L}[\p{L}\p{N}_]*$/u;
const EMOJI = /^(?:\p{Extended_Pictographic}|\p{Emoji_Modifier}|\p{Regional_Indicator}|\u200d|\ufe0f)+$/u;
const ASCII_FACE = /^(?:[:;=8][-'^o]?[()[\]{}dDpPoO3|/\\*$@]+|[()[\]dDpP][-'^o]?[:;=]|<3+|\^[_.-]?\^|[xX][dD]+)$/u;
const ELONGATED = /(\p{L})\1\1/u;
const LOWER_LETTER_DIGIT = /^\p{Ll}[\p{L}\p{N}]*$/u;

/** The informal-text class of a word, or null when the extended tests apply (see the scheme's comment). */
function informalFeature(word: string): string | null {
  if (URL.test(word)) return "url";
  if (EMAIL.test(word)) return "email";
  if (HANDLE.test(word)) return "handle";
  if (HASHTAG.test(word)) return "hashtag";
  if (EMOJI.test(word) || ASCII_FACE.test(word)) return "emoticon";
  if (DIGIT.test(word)) return LOWER_LETTER_DIGIT.test(word) && LETTER.test(word) ? "lowerCaseDigit" : null;
  // All-capital words ("III", "WWF") keep allCaps: a tripled capital is an acronym or numeral.
  if (ELONGATED.test(word) && !ALL_UPPER_LETTERS.test(word)) return UPPER_START.test(word) ? "elongatedCap" : "elongatedLower";
  return null;
}

/** Name of the Bikel et al. (1997) feature of a word (without the firstWord rule). */
function baseFeature(word: string, scheme: WordClassScheme): string {
  if (scheme === "informal") {
    const informal = informalFeature(word);
    if (informal !== null) return informal;
  }
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
  if (ALL_UPPER_LETTERS.test(word)) return word.length === 1 && scheme !== "bikel" ? "initCap" : "allCaps";
  if (CAP_PERIOD.test(word)) return "capPeriod";
  if (UPPER_START.test(word)) {
    if (scheme !== "bikel") {
      if (word.includes("-")) return "initCapHyphen";
      if (INNER_UPPER.test(word)) return "mixedCaps";
    }
    return "initCap";
  }
  if (LOWER_START.test(word)) return scheme !== "bikel" && word.includes("-") ? "lowerCaseHyphen" : "lowerCase";
  if (scheme !== "bikel" && PUNCTUATION.test(word)) return "punctuation";
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
  return (scheme === "extended" ? EXTENDED_INDEX : INFORMAL_INDEX).get(firstInSentence ? `firstWord+${base}` : base) as number;
}

const BIKEL_INDEX = new Map<string, number>(BIKEL_CLASSES.map((name, i) => [name, i]));
const EXTENDED_INDEX = new Map<string, number>(EXTENDED_CLASSES.map((name, i) => [name, i]));
const INFORMAL_INDEX = new Map<string, number>(INFORMAL_CLASSES.map((name, i) => [name, i]));
/** Features that take precedence over firstWord in Bikel et al.'s ordering. */
const BEFORE_FIRST_WORD = new Set<string>(BIKEL_CLASSES.slice(0, BIKEL_CLASSES.indexOf("firstWord")));

/** True when a word starts with an upper-case letter (used to split suffix statistics). */
export function isCapitalized(word: string): boolean {
  return UPPER_START.test(word);
}
