import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { tokenizeDocumentText } from "@/documents/tokenize";
import { extractColumnFile } from "./column-file";
import { extractJsonlFile } from "./jsonl-file";
import { extractTextFile, findInvalidUtf8 } from "./text-file";

const ctx = { filename: "sample.txt", knownTypes: new Set(["PARTY", "PLACE"]), maxDocumentChars: 1_000_000, maxDocxEntries: 5000, maxDocxUnpackedBytes: 64 * 1024 * 1024, maxPdfPages: 2000, extractTimeLimitMs: 120_000 };
const utf8 = (s: string) => new TextEncoder().encode(s);

// Pieces of text from several scripts and whitespace kinds, so that generated documents mix
// accents (precomposed and combining), emoji (surrogate pairs, ZWJ sequences, a regional-indicator pair that is no country's flag), CJK,
// right-to-left scripts, digits, punctuation and line ends.
const pieces = [
  "Ada", "Brightwater", "Quillmark", "Ltd.", "café", "cafe\u0301", "naïve", "Łąka", "Ñandú", "straße",
  "🙂", "👩‍🔬", "🇽🇽", "😀😀", "霧港", "ミラクエは", "会社で働いています。", "바닷가", "ありがとう",
  "سافرت", "ليلى", "إلى", "שלום", "עולם", "؟", "«", "»", "4,000", "€", "12:30", "e-mail", "can't",
  ".", "!", "?", "…", "(", ")", "\"", "'", "-", "—",
];
const gaps = [" ", " ", " ", "\n", "\r\n", "\t", "\u00a0", "\u3000", "\n\n", "  "];
const documentText = fc
  .array(fc.tuple(fc.constantFrom(...pieces), fc.constantFrom(...gaps)), { minLength: 1, maxLength: 60 })
  .map((parts) => parts.map(([p, g]) => p + g).join(""));

function checkTokens(text: string, tokens: { starts: number[]; ends: number[]; sentenceStarts: number[] }): void {
  const { starts, ends, sentenceStarts } = tokens;
  expect(ends).toHaveLength(starts.length);
  let covered = 0;
  for (let i = 0; i < starts.length; i++) {
    const token = text.slice(starts[i], ends[i]);
    expect(token.length).toBeGreaterThan(0);
    expect(token).not.toMatch(/\s/);
    if (i > 0) expect(starts[i]).toBeGreaterThanOrEqual(ends[i - 1]!);
    // Whatever lies between two tokens is whitespace only.
    expect(text.slice(i > 0 ? ends[i - 1] : 0, starts[i])).toMatch(/^\s*$/);
    covered += token.length;
  }
  expect(text.slice(starts.length ? ends[ends.length - 1] : 0)).toMatch(/^\s*$/);
  expect(covered).toBe(text.replace(/\s/g, "").length);
  expect(sentenceStarts[0] ?? 0).toBe(0);
  for (let s = 1; s < sentenceStarts.length; s++) expect(sentenceStarts[s]).toBeGreaterThan(sentenceStarts[s - 1]!);
  if (sentenceStarts.length) expect(sentenceStarts[sentenceStarts.length - 1]).toBeLessThan(starts.length);
}

describe("token offsets on varied Unicode text", () => {
  it("a .txt file: every stored token is an exact slice of the stored text, and together they cover it", () => {
    fc.assert(
      fc.property(documentText, (text) => {
        fc.pre(text.trim().length > 0);
        const [doc] = extractTextFile(utf8(text), ctx);
        expect(doc!.text).toBe(text.replace(/\r\n/g, "\n"));
        checkTokens(doc!.text, tokenizeDocumentText(doc!.text));
      }),
      { numRuns: 300 },
    );
  });

  it("a JSONL line: the text is kept unit for unit, so span offsets keep pointing at the same characters", () => {
    fc.assert(
      fc.property(documentText, fc.nat(), (text, pick) => {
        fc.pre(text.trim().length > 0);
        const { starts, ends } = tokenizeDocumentText(text);
        fc.pre(starts.length > 0);
        const k = pick % starts.length;
        const span = { start: starts[k]!, end: ends[k]!, type: "PARTY" };
        const [doc] = extractJsonlFile(utf8(JSON.stringify({ text, spans: [span] })), { ...ctx, filename: "x.jsonl" });
        expect(doc!.text).toBe(text);
        expect(doc!.text.slice(doc!.spans![0]!.start, doc!.spans![0]!.end)).toBe(text.slice(span.start, span.end));
        checkTokens(doc!.text, tokenizeDocumentText(doc!.text));
      }),
      { numRuns: 300 },
    );
  });

  it("a column file: the rebuilt text's token offsets slice out the file's words and the tags' spans", () => {
    const word = fc.constantFrom(...pieces.filter((p) => !/\s/.test(p) && p !== "-DOCSTART-"));
    const tagged = fc.array(fc.tuple(word, fc.constantFrom("O", "B-PARTY", "I-PARTY", "B-PLACE", "I-PLACE")), { minLength: 1, maxLength: 12 });
    fc.assert(
      fc.property(fc.array(tagged, { minLength: 1, maxLength: 5 }), (sentences) => {
        const file = sentences.map((s) => s.map(([w, t]) => `${w}\t${t}`).join("\n")).join("\n\n");
        const [doc] = extractColumnFile(utf8(file), { ...ctx, filename: "x.conll" });
        const words = sentences.flat().map(([w]) => w);
        const { starts, ends, sentenceStarts } = doc!.tokens!;
        expect(starts.map((s, i) => doc!.text.slice(s, ends[i]))).toEqual(words);
        expect(sentenceStarts).toHaveLength(sentences.length);
        for (const span of doc!.spans!) expect(doc!.text.slice(span.start, span.end)).not.toMatch(/^\s|\s$/);
        checkTokens(doc!.text, doc!.tokens!);
      }),
      { numRuns: 200 },
    );
  });
});

describe("UTF-8 checks", () => {
  it("findInvalidUtf8 agrees with a strict decoder on random bytes (RFC 3629, section 4)", () => {
    const strict = new TextDecoder("utf-8", { fatal: true });
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 64 }), (bytes) => {
        let valid = true;
        try {
          strict.decode(bytes);
        } catch {
          valid = false;
        }
        const at = findInvalidUtf8(bytes);
        expect(at === -1).toBe(valid);
        if (!valid) expect(() => strict.decode(bytes.subarray(0, at))).not.toThrow();
      }),
      { numRuns: 2000 },
    );
  });

  it("names the offset of overlong forms, surrogates and truncated sequences (RFC 3629, section 3)", () => {
    expect(findInvalidUtf8(Uint8Array.from([0x41, 0xc0, 0xaf]))).toBe(1); // overlong "/"
    expect(findInvalidUtf8(Uint8Array.from([0x41, 0x42, 0xed, 0xa0, 0x80]))).toBe(2); // U+D800
    expect(findInvalidUtf8(Uint8Array.from([0xf4, 0x90, 0x80, 0x80]))).toBe(0); // above U+10FFFF
    expect(findInvalidUtf8(Uint8Array.from([0x41, 0xe2, 0x82]))).toBe(1); // cut short
    expect(findInvalidUtf8(utf8("é東🙂"))).toBe(-1);
  });

  it("refuses a .txt file with a bad byte, saying where", () => {
    expect(() => extractTextFile(Uint8Array.from([0x61, 0x62, 0xff]), ctx)).toThrow(/offset 2 \(byte 0xFF\)/);
  });
});
