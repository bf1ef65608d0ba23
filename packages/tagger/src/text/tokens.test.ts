import fc from "fast-check";
import createWinkTokenizer from "wink-tokenizer";
import { describe, expect, it } from "vitest";
import { findTokens, isWhitespaceCode, planSegments, splitSentences, tokenizeText, tokenizeWords, type Token } from "./tokens";

const FRAGMENTS = [
  "Hello", "world", "café", "naïve", "Zoë", "e\u0301", "\u0301", "😀", "👍🏽", "👨‍👩‍👧", "🇫🇷", "日本語", "中文。", "。",
  "שלום", "مرحبا", "؟", "،", "Привет", "ελληνικά", " ", " ", "  ", "\t", "\n", "\n\n", "\r\n", "\r\n\r\n", "\u00a0",
  "\u2028", "\u3000", "\u200b", ".", ".", "!", "?", "?!", "…", "\"", "'", "”", "’", ")", "(", "«", "»", ",", ";", ":",
  "Mr", "Dr", "J", "e.g.", "etc", "4", "pm", "4 pm", "12:30", "3.5", "1,000", "LET'S", "don't", "can't", "éa's",
  "dogs'", "x@y.com", "http://a.bc/d", "#tag", "@me", "$", "€", "&", "∑", "☃", ":-)", "-", "—",
];

const textArbitrary = fc
  .array(fc.oneof(fc.constantFrom(...FRAGMENTS), fc.string({ unit: "grapheme", maxLength: 4 }), fc.string({ unit: "binary", maxLength: 3 })), {
    maxLength: 60,
  })
  .map((parts) => parts.join(""));

// Plain checks rather than one expect per character: the long-input test runs this on 200k characters.
function checkInvariants(text: string, tokens: readonly Token[]): void {
  let previousEnd = 0;
  const fail = (why: string): never => {
    throw new Error(`${why} in ${JSON.stringify(text.length > 200 ? text.slice(0, 200) : text)}`);
  };
  for (const t of tokens) {
    if (t.start < previousEnd) fail(`token ${t.start}-${t.end} overlaps or is out of order`);
    if (t.end <= t.start) fail(`empty token at ${t.start}`);
    for (let i = previousEnd; i < t.start; i++) if (!isWhitespaceCode(text.charCodeAt(i))) fail(`character ${i} is in no token`);
    for (let i = t.start; i < t.end; i++) if (isWhitespaceCode(text.charCodeAt(i))) fail(`whitespace ${i} inside a token`);
    previousEnd = t.end;
  }
  for (let i = previousEnd; i < text.length; i++) if (!isWhitespaceCode(text.charCodeAt(i))) fail(`character ${i} is in no token`);
}

// Where wink's values are verbatim (it neither rewrote nor dropped anything), each value must be
// recovered as one token or as consecutive tokens spanning exactly that value.
function checkAlignedWithWink(text: string, tokens: readonly Token[]): boolean {
  const values = createWinkTokenizer()
    .tokenize(text)
    .map((v) => v.value)
    .filter((v) => v.length > 0);
  if (values.join("") !== text.replace(/\s+/g, "")) return false;
  let k = 0;
  for (const value of values) {
    const first = tokens[k];
    let last = k;
    while (last < tokens.length && tokens[last].end - first.start < value.length) last++;
    expect(text.slice(first.start, tokens[last].end)).toBe(value);
    k = last + 1;
  }
  expect(k).toBe(tokens.length);
  return true;
}

describe("isWhitespaceCode", () => {
  it("agrees with JavaScript's \\s on every UTF-16 code unit", () => {
    for (let code = 0; code <= 0xffff; code++) {
      if (isWhitespaceCode(code) !== /\s/.test(String.fromCharCode(code))) throw new Error(`differs at U+${code.toString(16)}`);
    }
  });
});

describe("tokenizeText: tokens", () => {
  it("recovers offsets for a plain sentence", () => {
    // Worked by hand from wink-tokenizer 5.3.0's documented behaviour (JSDoc of tokenize(): common
    // contractions split in two, e.g. "won't" → "wo" + "n't"); "4 pm" is its time class, split here.
    const text = "  Mr. Smith paid $40 at 4 pm, didn't he?";
    const { tokens } = tokenizeText(text);
    expect(tokens.map((t) => text.slice(t.start, t.end))).toEqual([
      "Mr", ".", "Smith", "paid", "$", "40", "at", "4", "pm", ",", "did", "n't", "he", "?",
    ]);
    expect(tokens[0]).toEqual({ start: 2, end: 4 });
    checkInvariants(text, tokens);
  });

  it("keeps offsets right where wink rewrites or drops characters", () => {
    // wink-tokenizer 5.3.0's contraction table maps "LET'S" to "THAT" + "'S", and its possessive
    // pattern drops "é" from "éa's"; offsets must still slice the real text.
    const text = "LET'S GO, éa's dog";
    const words = tokenizeWords(text);
    expect(words).toEqual(["LET", "'S", "GO", ",", "éa", "'s", "dog"]);
    checkInvariants(text, tokenizeText(text).tokens);
  });

  it("splits punctuation out of scripts wink has no pattern for, and never keeps whitespace in a token", () => {
    // Worked by hand: 「」。؟«» are Unicode punctuation (general category P) that wink leaves inside
    // its "alien" tokens.
    expect(tokenizeWords("「引用」。مرحبا؟ «dit»")).toEqual(["「", "引用", "」", "。", "مرحبا", "؟", "«", "dit", "»"]);
    expect(tokenizeWords("at 4\npm. Go")).toEqual(["at", "4", "pm.", "Go"]);
  });

  it("handles empty and whitespace-only text", () => {
    expect(tokenizeText("")).toEqual({ tokens: [], sentences: [] });
    expect(tokenizeText(" \n\t\u00a0")).toEqual({ tokens: [], sentences: [] });
  });

  it("property: tokens are ordered, non-empty, whitespace-free slices covering all other text", () => {
    fc.assert(
      fc.property(textArbitrary, (text) => {
        checkInvariants(text, tokenizeText(text).tokens);
      }),
      { seed: 1701, numRuns: 400 },
    );
  });

  it("property: every verbatim wink value is recovered at its place", () => {
    let aligned = 0;
    fc.assert(
      fc.property(textArbitrary, (text) => {
        if (checkAlignedWithWink(text, findTokens(text))) aligned++;
      }),
      { seed: 1702, numRuns: 400 },
    );
    // The check must actually run on most inputs, not be skipped.
    expect(aligned).toBeGreaterThan(200);
  });

  it("property: cutting the text into small segments at safe whitespace changes nothing", () => {
    const words = fc.constantFrom("alpha", "4", "pm", "12:30", "hours", "x@y.com", "Mr", ".", "日本", "😀", "LET'S", "?");
    const spaces = fc.constantFrom(" ", "  ", "\n", "\t");
    const text = fc.array(fc.tuple(words, spaces), { maxLength: 80 }).map((pairs) => pairs.map(([w, s]) => w + s).join(""));
    fc.assert(
      fc.property(text, (t) => {
        expect(findTokens(t, 8, 1000)).toEqual(findTokens(t, 1_000_000, 1_000_000));
      }),
      { seed: 1703, numRuns: 300 },
    );
  });
});

describe("planSegments", () => {
  it("cuts only at whitespace that cannot sit inside a wink time token, or inside over-long runs", () => {
    expect(planSegments("", 4, 100)).toEqual([0]);
    // "4 pm" must not be cut at its space; the next safe whitespace is after "pm".
    expect(planSegments("abcd 4 pm xy", 4, 100)).toEqual([0, 4, 9, 12]);
    expect(planSegments("abcdefghij", 100, 4)).toEqual([0, 4, 8, 10]);
    // A surrogate pair straddling a hard cut moves the cut one unit on.
    expect(planSegments("abc😀def", 100, 4)).toEqual([0, 5, 8]);
  });
});

describe("tokenizeText: long input", () => {
  it("tokenizes 100k tokens and a 200k-character run without whitespace in bounded time", () => {
    // Called on the whole text, wink-tokenizer needs about 0.5 s for a 10k-character run and grows
    // quadratically (measured here); a 200k run would take minutes.
    const words = ["The", "court", "fined", "Acme", "Ltd.", "$4,000", "on", "12/03/2020", ";", "Mr.", "J.", "Doe", "agreed", "."];
    const parts: string[] = [];
    for (let i = 0; i < 100_000; i++) parts.push(words[i % words.length]);
    const text = parts.join(" ");
    let started = performance.now();
    const { tokens, sentences } = tokenizeText(text);
    expect(performance.now() - started).toBeLessThan(10_000);
    expect(tokens.length).toBeGreaterThanOrEqual(100_000);
    expect(sentences.length).toBeGreaterThan(1000);

    const run = "ab1.".repeat(50_000);
    started = performance.now();
    const runTokens = tokenizeText(run).tokens;
    expect(performance.now() - started).toBeLessThan(10_000);
    checkInvariants(run, runTokens);
  });
});

describe("splitSentences", () => {
  const sentencesOf = (text: string): string[] => {
    const { tokens, sentences } = tokenizeText(text);
    return sentences.map((s) => text.slice(tokens[s.start].start, tokens[s.end - 1].end));
  };

  // Expected sentences below are worked by hand from the rule documented on splitSentences.
  it("ends sentences after final punctuation, keeping runs and closing quotes", () => {
    expect(sentencesOf('Really?! He said "Stop." Then (quietly) left. Done')).toEqual([
      "Really?!",
      'He said "Stop."',
      "Then (quietly) left.",
      "Done",
    ]);
  });

  it("needs whitespace after ASCII terminals but not after CJK ones", () => {
    expect(sentencesOf("Open file.txt now. Next one!Really. Last")).toEqual(["Open file.txt now.", "Next one!Really.", "Last"]);
    expect(sentencesOf('He said "Stop."Then left.')).toEqual(['He said "Stop."Then left.']);
  });

  it("does not end after abbreviations and initials", () => {
    // The abbreviation list is common practice (titles and Latin abbreviations), not from a source.
    expect(sentencesOf("Mr. J. Smith met Dr. Lee, e.g. at noon, etc. and left. Fine.")).toEqual([
      "Mr. J. Smith met Dr. Lee, e.g. at noon, etc. and left.",
      "Fine.",
    ]);
  });

  it("ends sentences at blank lines, with or without carriage returns", () => {
    expect(sentencesOf("Title line\n\nFirst para\r\n\r\nSecond\none line")).toEqual(["Title line", "First para", "Second\none line"]);
  });

  it("uses Unicode sentence terminals", () => {
    // U+3002 。 and U+061F ؟ carry the Sentence_Terminal property (Unicode Standard Annex #44,
    // "Unicode Character Database", PropList.txt); U+2026 … is added here by choice.
    expect(sentencesOf("今日は。明日も。")).toEqual(["今日は。", "明日も。"]);
    expect(sentencesOf("مرحبا؟ نعم.")).toEqual(["مرحبا؟", "نعم."]);
    expect(sentencesOf("Wait… what")).toEqual(["Wait…", "what"]);
  });

  it("property: sentences cover all tokens contiguously and none is empty", () => {
    fc.assert(
      fc.property(textArbitrary, (text) => {
        const { tokens, sentences } = tokenizeText(text);
        let next = 0;
        for (const s of sentences) {
          expect(s.start).toBe(next);
          expect(s.end).toBeGreaterThan(s.start);
          next = s.end;
        }
        expect(next).toBe(tokens.length);
      }),
      { seed: 1704, numRuns: 400 },
    );
  });

  it("accepts tokens from elsewhere", () => {
    const text = "a. b";
    expect(splitSentences(text, [{ start: 0, end: 1 }, { start: 1, end: 2 }, { start: 3, end: 4 }])).toEqual([{ start: 0, end: 3 }]);
    expect(splitSentences("ab. c", [{ start: 0, end: 2 }, { start: 2, end: 3 }, { start: 4, end: 5 }])).toEqual([
      { start: 0, end: 2 },
      { start: 2, end: 3 },
    ]);
  });
});
