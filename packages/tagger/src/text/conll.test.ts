import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { toIob2 } from "./bio";
import { ColumnFormatError, formatTaggedSentences, parseColumnText, type TaggedSentence } from "./conll";

function errorOf(run: () => unknown): ColumnFormatError {
  try {
    run();
  } catch (error) {
    if (error instanceof ColumnFormatError) return error;
    throw error;
  }
  throw new Error("expected a ColumnFormatError");
}

// Expected documents and line numbers below are worked by hand from the inputs.
describe("parseColumnText", () => {
  it("reads a CoNLL-2003-style file with -DOCSTART-, four columns and IOB1 tags", () => {
    // Made-up lines (invented names) in the layout of the CoNLL-2003 shared task files (Tjong Kim Sang & De Meulder 2003, "Introduction to
    // the CoNLL-2003 Shared Task: Language-Independent Named Entity Recognition", §2, data format):
    // word, POS, chunk and NE tag; IOB1 NE tags, so I-X opens an
    // entity unless two of a type touch.
    const text = [
      "-DOCSTART- -X- -X- O",
      "",
      "Quorvel NNP B-NP I-ORG",
      "rejects VBZ B-VP O",
      "Ostravic JJ B-NP I-MISC",
      "call NN I-NP O",
      ". . O O",
      "",
      "Pell NNP B-NP I-PER",
      "Vantorro NNP I-NP I-PER",
      "",
      "-DOCSTART- -X- -X- O",
      "",
      "KESTRANE NNP B-NP I-LOC",
      "",
    ].join("\n");
    const { documents, scheme } = parseColumnText(text);
    expect(scheme).toBe("iob");
    expect(documents).toEqual([
      {
        sentences: [
          { words: ["Quorvel", "rejects", "Ostravic", "call", "."], tags: ["I-ORG", "O", "I-MISC", "O", "O"] },
          { words: ["Pell", "Vantorro"], tags: ["I-PER", "I-PER"] },
        ],
      },
      { sentences: [{ words: ["KESTRANE"], tags: ["I-LOC"] }] },
    ]);
    expect(toIob2(documents[0].sentences[0].tags)).toEqual(["B-ORG", "O", "B-MISC", "O", "O"]);
  });

  it("reads plain POS tags, spaces or tabs, CRLF, a BOM, blank lines holding spaces, and no -DOCSTART-", () => {
    const text = "\uFEFFThe\tDT\r\ndog  NN\r\n \t \r\nbarks \t VBZ\r\n\r\n\r\n";
    expect(parseColumnText(text)).toEqual({
      documents: [{ sentences: [{ words: ["The", "dog"], tags: ["DT", "NN"] }, { words: ["barks"], tags: ["VBZ"] }] }],
      scheme: "plain",
    });
    expect(parseColumnText(text, { scheme: "plain" }).scheme).toBe("plain");
  });

  it("calls a file of O tags iob, and forced plain stays plain", () => {
    expect(parseColumnText("a O\nb O").scheme).toBe("iob");
    expect(parseColumnText("a B-X\nb I-X", { scheme: "plain" }).scheme).toBe("plain");
  });

  it("starts a document at -DOCSTART- even without a blank line, and drops empty documents", () => {
    const { documents } = parseColumnText("-DOCSTART- O\n-DOCSTART- O\na O\n-DOCSTART-\nb B-X\n\n\n-DOCSTART- O\n");
    expect(documents).toEqual([{ sentences: [{ words: ["a"], tags: ["O"] }] }, { sentences: [{ words: ["b"], tags: ["B-X"] }] }]);
  });

  it("takes one-column lines as untagged tokens when tags are not required", () => {
    const result = parseColumnText("Hello\nworld O\n", { requireTags: false });
    expect(result).toEqual({ documents: [{ sentences: [{ words: ["Hello", "world"], tags: ["", "O"] }] }], scheme: "plain" });
  });

  it("reports a one-column line with its line number", () => {
    const error = errorOf(() => parseColumnText("a O\n\nb O\nc\n", { file: "train.conll" }));
    expect(error).toBeInstanceOf(Error);
    expect(error.file).toBe("train.conll");
    expect(error.line).toBe(4);
    expect(error.reason).toBe("expected at least 2 columns (token and tag)");
    expect(error.message).toBe("train.conll:4: expected at least 2 columns (token and tag)");
    expect(error.name).toBe("ColumnFormatError");
  });

  it("counts lines after a BOM and across CRLF and CR line ends", () => {
    expect(errorOf(() => parseColumnText("\uFEFFa O\r\nb O\r\n\r\nc\r\n")).message).toBe("<input>:4: expected at least 2 columns (token and tag)");
    expect(errorOf(() => parseColumnText("a O\rb\r")).line).toBe(2);
  });

  it("reports a non-IOB tag under scheme iob, naming the tag and line", () => {
    const error = errorOf(() => parseColumnText("a O\nb B-PER\nc NNP\n", { scheme: "iob", file: "x.tsv" }));
    expect(error.message).toBe('x.tsv:3: tag "NNP" is not an IOB tag (scheme iob expects O, B-TYPE or I-TYPE)');
    expect(errorOf(() => parseColumnText("a O\nb B-\n", { scheme: "iob" })).line).toBe(2);
    expect(errorOf(() => parseColumnText("a O\nb\n", { scheme: "iob", requireTags: false })).message).toBe(
      "<input>:2: missing tag (scheme iob expects O, B-TYPE or I-TYPE)",
    );
  });

  it("reports a file without tokens", () => {
    for (const text of ["", "\uFEFF", "\n \n\t\n", "-DOCSTART- -X- O\n\n-DOCSTART- -X- O\n"]) {
      expect(errorOf(() => parseColumnText(text, { file: "empty.conll" })).message).toBe("empty.conll:1: no tokens");
    }
  });
});

describe("formatTaggedSentences", () => {
  it("writes token<TAB>tag lines and a blank line after each sentence", () => {
    expect(formatTaggedSentences([{ words: ["Quorvel", "rejects"], tags: ["B-ORG", "O"] }, { words: [], tags: [] }, { words: ["Hi"], tags: ["O"] }])).toBe(
      "Quorvel\tB-ORG\nrejects\tO\n\nHi\tO\n\n",
    );
  });

  it("refuses what could not be read back", () => {
    expect(() => formatTaggedSentences([{ words: ["a"], tags: [] }])).toThrow("sentence 0 has 1 words but 0 tags");
    expect(() => formatTaggedSentences([{ words: ["a b"], tags: ["O"] }])).toThrow(RangeError);
    expect(() => formatTaggedSentences([{ words: ["a"], tags: [""] }])).toThrow(RangeError);
    expect(() => formatTaggedSentences([{ words: ["-DOCSTART-"], tags: ["O"] }])).toThrow(RangeError);
  });

  it("property: parse(format(sentences)) gives the sentences back", () => {
    const word = fc.string({ unit: "grapheme", minLength: 1, maxLength: 6 }).filter((w) => !/[ \t\r\n]/.test(w) && w !== "-DOCSTART-" && w !== "\uFEFF" && !w.startsWith("\uFEFF"));
    const sentence: fc.Arbitrary<TaggedSentence> = fc
      .array(fc.tuple(word, fc.constantFrom("O", "B-PER", "I-PER", "NN")), { minLength: 1, maxLength: 8 })
      .map((pairs) => ({ words: pairs.map((p) => p[0]), tags: pairs.map((p) => p[1]) }));
    fc.assert(
      fc.property(fc.array(sentence, { minLength: 1, maxLength: 6 }), (sentences) => {
        const { documents } = parseColumnText(formatTaggedSentences(sentences));
        expect(documents).toEqual([{ sentences }]);
      }),
      { seed: 3101, numRuns: 300 },
    );
  });
});
