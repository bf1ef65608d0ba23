import createWinkTokenizer from "wink-tokenizer";

/** A token as UTF-16 offsets into the text it came from (end exclusive). */
export type Token = { start: number; end: number };

/** Tokens in text order, and sentences as token-index ranges (end exclusive) covering them all. */
export type TokenizedText = { tokens: Token[]; sentences: Array<{ start: number; end: number }> };

// wink-tokenizer's e-mail pattern backtracks over every start position of a long run without
// whitespace, so one call on a 40k-character run takes seconds. The text is therefore handed to it
// in segments of about SEGMENT_CHARS, cut at whitespace, and a run longer than MAX_RUN_CHARS is cut
// hard (no real word is that long). That keeps the whole pass linear in the text length.
const SEGMENT_CHARS = 4096;
const MAX_RUN_CHARS = 256;

const wink = createWinkTokenizer();

const PUNCTUATION = /\p{P}/uy;
const LETTER = /\p{L}/uy;
// U+2026 (…) is not Sentence_Terminal in Unicode but ends sentences as "..." does.
const SENTENCE_FINAL = /[\p{Sentence_Terminal}\u2026]/uy;
const CLOSING = /[\p{Pe}\p{Pf}"']/uy;

// Compared lower-cased with the token before a "." that touches it. Kept short on purpose: every
// entry also stops a real sentence end ("... works at Acme Inc."), so only forms that rarely end
// a sentence are listed. Single letters (initials, "e.g.", "i.e.") are handled separately.
const ABBREVIATIONS = new Set([
  "mr", "mrs", "ms", "dr", "prof", "sr", "jr", "st", "rev", "gen", "col", "lt", "sgt", "capt",
  "vs", "etc", "cf", "al", "approx", "fig", "figs",
]);

/** The characters JavaScript's `\s` and `String.prototype.trim` treat as whitespace. */
export function isWhitespaceCode(code: number): boolean {
  if (code <= 0x20) return code === 0x20 || (code >= 0x09 && code <= 0x0d);
  if (code < 0xa0) return false;
  return (
    code === 0xa0 ||
    code === 0x1680 ||
    (code >= 0x2000 && code <= 0x200a) ||
    code === 0x2028 ||
    code === 0x2029 ||
    code === 0x202f ||
    code === 0x205f ||
    code === 0x3000 ||
    code === 0xfeff
  );
}

function isHighSurrogate(code: number): boolean {
  return code >= 0xd800 && code <= 0xdbff;
}

function isLowSurrogate(code: number): boolean {
  return code >= 0xdc00 && code <= 0xdfff;
}

function isAsciiDigit(code: number): boolean {
  return code >= 0x30 && code <= 0x39;
}

// wink's time pattern is the only one that reaches across whitespace ("4 pm", "16:00 hours"): a
// digit, one whitespace character, then a, p or h. A cut anywhere else cannot change its output.
function isSafeCut(text: string, i: number): boolean {
  if (i === 0 || !isAsciiDigit(text.charCodeAt(i - 1))) return true;
  const next = text.charCodeAt(i + 1) | 0x20;
  return next !== 0x61 && next !== 0x70 && next !== 0x68;
}

/**
 * Where tokenizeText hands the text to wink-tokenizer: ascending offsets starting at 0 and ending
 * at text.length. Internal; exported for tests.
 */
export function planSegments(text: string, segmentChars = SEGMENT_CHARS, maxRunChars = MAX_RUN_CHARS): number[] {
  const cuts = [0];
  let segmentStart = 0;
  let run = 0;
  for (let i = 0; i < text.length; i++) {
    const code = text.charCodeAt(i);
    if (isWhitespaceCode(code)) {
      run = 0;
      const length = i - segmentStart;
      // Past four segment lengths without a safe cut, any whitespace will do (bounded cost wins
      // over keeping a rare "4 pm" together).
      if (length >= segmentChars && (length >= 4 * segmentChars || isSafeCut(text, i))) {
        cuts.push(i);
        segmentStart = i;
      }
    } else {
      run++;
      // Never cut between the two halves of a surrogate pair.
      if (run > maxRunChars && !(isLowSurrogate(code) && i > 0 && isHighSurrogate(text.charCodeAt(i - 1)))) {
        cuts.push(i);
        segmentStart = i;
        run = 1;
      }
    }
  }
  if (text.length > 0) cuts.push(text.length);
  return cuts;
}

function skipWhitespace(text: string, from: number, limit: number): number {
  let i = from;
  while (i < limit && isWhitespaceCode(text.charCodeAt(i))) i++;
  return i;
}

// Pushes [start, end) as tokens, split at whitespace; for wink's "alien" class (text it has no
// pattern for: CJK, Arabic, Hebrew, unlisted symbols) each punctuation mark also becomes its own
// token, so that "。", "؟" or "»" can end a sentence and "«" does not stick to a word.
function pushPieces(text: string, start: number, end: number, splitPunctuation: boolean, out: Token[]): void {
  let pieceStart = -1;
  let i = start;
  while (i < end) {
    const code = text.charCodeAt(i);
    if (isWhitespaceCode(code)) {
      if (pieceStart >= 0) out.push({ start: pieceStart, end: i });
      pieceStart = -1;
      i++;
      continue;
    }
    const width = isHighSurrogate(code) && i + 1 < end && isLowSurrogate(text.charCodeAt(i + 1)) ? 2 : 1;
    if (splitPunctuation) {
      PUNCTUATION.lastIndex = i;
      if (PUNCTUATION.test(text)) {
        if (pieceStart >= 0) out.push({ start: pieceStart, end: i });
        out.push({ start: i, end: i + width });
        pieceStart = -1;
        i += width;
        continue;
      }
    }
    if (pieceStart < 0) pieceStart = i;
    i += width;
  }
  if (pieceStart >= 0) out.push({ start: pieceStart, end });
}

function pushToken(text: string, start: number, end: number, tag: string, out: Token[]): void {
  // Only wink's time class can hold whitespace ("4 pm"); splitting it keeps the promise that no
  // token contains whitespace, which column files rely on.
  if (tag === "alien" || tag === "time") pushPieces(text, start, end, tag === "alien", out);
  else out.push({ start, end });
}

// wink-tokenizer returns values without offsets, and a value is not always verbatim: its
// contraction table maps "LET'S" to "THAT" + "'S". Values are matched at a forward cursor after
// whitespace; on a mismatch the cursor resynchronises on the next value found in the segment and
// the skipped stretch becomes tokens of its own, so every token is a slice of the text.
function alignSegment(text: string, start: number, end: number, out: Token[]): void {
  const segment = text.slice(start, end);
  const values = wink.tokenize(segment);
  let cursor = start;
  let i = 0;
  while (i < values.length) {
    const { value, tag } = values[i];
    if (value.length === 0) {
      i++;
      continue;
    }
    const at = skipWhitespace(text, cursor, end);
    if (text.startsWith(value, at) && at + value.length <= end) {
      pushToken(text, at, at + value.length, tag, out);
      cursor = at + value.length;
      i++;
      continue;
    }
    let next = i + 1;
    let found = -1;
    for (; next < values.length; next++) {
      const candidate = values[next].value;
      if (candidate.length === 0) continue;
      const k = segment.indexOf(candidate, at - start);
      if (k >= 0) {
        found = start + k;
        break;
      }
    }
    const stop = found >= 0 ? found : end;
    pushPieces(text, at, stop, false, out);
    cursor = stop;
    i = found >= 0 ? next : values.length;
  }
}

/** Tokens of `text` without sentences. Internal; the segment sizes are parameters for tests. */
export function findTokens(text: string, segmentChars = SEGMENT_CHARS, maxRunChars = MAX_RUN_CHARS): Token[] {
  const tokens: Token[] = [];
  const cuts = planSegments(text, segmentChars, maxRunChars);
  for (let k = 1; k < cuts.length; k++) alignSegment(text, cuts[k - 1], cuts[k], tokens);
  return tokens;
}

function isRunOf(pattern: RegExp, text: string, start: number, end: number): boolean {
  let i = start;
  while (i < end) {
    pattern.lastIndex = i;
    if (!pattern.test(text)) return false;
    i = pattern.lastIndex;
  }
  return end > start;
}

function isAscii(text: string, start: number, end: number): boolean {
  for (let i = start; i < end; i++) if (text.charCodeAt(i) > 0x7f) return false;
  return true;
}

function countLineBreaks(text: string, start: number, end: number): number {
  let count = 0;
  for (let i = start; i < end; i++) {
    const code = text.charCodeAt(i);
    if (code === 0x0a || code === 0x2028 || code === 0x2029) count++;
    else if (code === 0x0d && text.charCodeAt(i + 1) !== 0x0a) count++;
  }
  return count;
}

function isAbbreviationStop(text: string, tokens: readonly Token[], i: number): boolean {
  const stop = tokens[i];
  if (stop.end - stop.start !== 1 || text.charCodeAt(stop.start) !== 0x2e || i === 0) return false;
  const before = tokens[i - 1];
  if (before.end !== stop.start) return false;
  const length = before.end - before.start;
  const firstWidth = isHighSurrogate(text.charCodeAt(before.start)) && isLowSurrogate(text.charCodeAt(before.start + 1)) ? 2 : 1;
  if (length === firstWidth) {
    LETTER.lastIndex = before.start;
    if (LETTER.test(text)) return true;
  }
  return length <= 6 && ABBREVIATIONS.has(text.slice(before.start, before.end).toLowerCase());
}

/**
 * Sentence ranges over `tokens` (token indices, end exclusive), covering every token in order.
 *
 * The rule, kept simple on purpose:
 * - a sentence ends after a token made only of sentence-final punctuation (Unicode
 *   Sentence_Terminal: . ! ? 。 ؟ । and relatives, plus …); a run of such tokens ("?!", ". . .")
 *   and closing quotes or brackets touching the run stay with the sentence they close;
 * - after ASCII . ! ? the next token must not touch the run ("file.txt", "Yahoo!Mail" stay whole);
 *   other scripts' terminals need no space after them ("今日は。明日も。");
 * - a "." does not end a sentence when it touches a single letter before it (initials "J.",
 *   "e.g.", "i.e.", "U.S.") or a listed abbreviation (Mr, Dr, etc, ...);
 * - a gap between tokens holding two or more line breaks (a blank line) always ends a sentence.
 * Known misses: a sentence ending in an initial or abbreviation runs on into the next; a time
 * such as "5 p.m." keeps its final period, so it does not end a sentence.
 */
export function splitSentences(text: string, tokens: readonly Token[]): Array<{ start: number; end: number }> {
  const sentences: Array<{ start: number; end: number }> = [];
  let sentenceStart = 0;
  let closing = false;
  let closingIsAscii = false;
  for (let i = 0; i < tokens.length; i++) {
    const token = tokens[i];
    const isFinal = isRunOf(SENTENCE_FINAL, text, token.start, token.end);
    if (i > 0) {
      const previousEnd = tokens[i - 1].end;
      let boundary = countLineBreaks(text, previousEnd, token.start) >= 2;
      if (!boundary && closing) {
        const touches = previousEnd === token.start;
        if (isFinal) closingIsAscii &&= isAscii(text, token.start, token.end);
        else if (!(touches && isRunOf(CLOSING, text, token.start, token.end))) {
          if (touches && closingIsAscii) closing = false;
          else boundary = true;
        }
      }
      if (boundary) {
        sentences.push({ start: sentenceStart, end: i });
        sentenceStart = i;
        closing = false;
      }
    }
    if (!closing && isFinal && !isAbbreviationStop(text, tokens, i)) {
      closing = true;
      closingIsAscii = isAscii(text, token.start, token.end);
    }
  }
  if (tokens.length > sentenceStart) sentences.push({ start: sentenceStart, end: tokens.length });
  return sentences;
}

/**
 * Tokenizes `text` with wink-tokenizer and recovers each token's UTF-16 offsets, so that
 * `text.slice(t.start, t.end)` is the token for every token. Tokens are in order, never overlap,
 * never contain whitespace, and together cover every non-whitespace character. Sentences follow
 * {@link splitSentences}. Linear in the text length.
 */
export function tokenizeText(text: string): TokenizedText {
  const tokens = findTokens(text);
  return { tokens, sentences: splitSentences(text, tokens) };
}

/** The token strings of `text`, as tokenizeText would slice them. */
export function tokenizeWords(text: string): string[] {
  return findTokens(text).map((t) => text.slice(t.start, t.end));
}
