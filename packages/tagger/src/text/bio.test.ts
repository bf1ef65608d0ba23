import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { chunksToTags, isIobTag, spansToTags, tagsToChunks, tagsToSpans, toIob2, type CharSpan, type Chunk } from "./bio";
import { tokenizeText, type Token } from "./tokens";

describe("isIobTag", () => {
  it("accepts O, B-X and I-X only", () => {
    for (const tag of ["O", "B-PER", "I-PER", "B-WORK-OF-ART", "I-x"]) expect(isIobTag(tag)).toBe(true);
    for (const tag of ["", "o", "B-", "I-", "B", "E-PER", "S-PER", "PER", "b-PER", "BPER", "NN"]) expect(isIobTag(tag)).toBe(false);
  });
});

describe("tagsToChunks (CoNLL conlleval convention)", () => {
  it("reads IOB2", () => {
    expect(tagsToChunks(["B-PER", "I-PER", "O", "B-LOC", "B-LOC"])).toEqual([
      { type: "PER", start: 0, end: 2 },
      { type: "LOC", start: 3, end: 4 },
      { type: "LOC", start: 4, end: 5 },
    ]);
  });

  it("reads IOB1 the same way: I-X after O or another type opens a chunk, B-X splits two of a type", () => {
    // conlleval's chunk rules (the CoNLL-2000 shared task's evaluation script, 2004 version; its
    // startOfChunk/endOfChunk, from memory): a chunk starts at B-X, at I-X after O and at a type
    // change, and ends before B, O or a type change. Worked by hand.
    expect(tagsToChunks(["I-PER", "I-PER", "B-PER", "O", "I-LOC", "I-ORG"])).toEqual([
      { type: "PER", start: 0, end: 2 },
      { type: "PER", start: 2, end: 3 },
      { type: "LOC", start: 4, end: 5 },
      { type: "ORG", start: 5, end: 6 },
    ]);
  });

  it("repairs a type change inside a chunk and keeps hyphens in types", () => {
    expect(tagsToChunks(["B-ORG", "I-ORG", "I-LOC", "I-WORK-OF-ART"])).toEqual([
      { type: "ORG", start: 0, end: 2 },
      { type: "LOC", start: 2, end: 3 },
      { type: "WORK-OF-ART", start: 3, end: 4 },
    ]);
    expect(tagsToChunks([])).toEqual([]);
    expect(tagsToChunks(["O", "O"])).toEqual([]);
  });

  it("finds 8 gold and 8 predicted chunks in six edge-case sentences, as conlleval does", () => {
    // conlleval (CoNLL-2000 shared task evaluation script, 2004 version) reports 8 gold phrases
    // and 8 found phrases over the six sentences below; by hand: gold PER LOC | ORG | PER PER |
    // MISC | LOC | PER, predicted PER LOC | ORG LOC | PER | MISC | PER | PER.
    const gold = [["B-PER", "I-PER", "O", "B-LOC"], ["B-ORG", "I-ORG", "I-ORG", "O"], ["B-PER", "B-PER", "O"], ["O", "B-MISC", "I-MISC"], ["B-LOC", "O", "O"], ["I-PER"]];
    const predicted = [["B-PER", "I-PER", "O", "I-LOC"], ["B-ORG", "I-ORG", "I-LOC", "O"], ["B-PER", "I-PER", "O"], ["O", "B-MISC", "I-MISC"], ["O", "O", "B-PER"], ["B-PER"]];
    expect(gold.reduce((n, s) => n + tagsToChunks(s).length, 0)).toBe(8);
    expect(predicted.reduce((n, s) => n + tagsToChunks(s).length, 0)).toBe(8);
  });

  it("throws on a tag that is not IOB, naming it and its index", () => {
    expect(() => tagsToChunks(["O", "E-PER"])).toThrow(/"E-PER" at index 1/);
  });
});

// Expected tags and spans in the examples below are worked by hand.
describe("chunksToTags and toIob2", () => {
  it("writes IOB2", () => {
    expect(chunksToTags(5, [{ type: "LOC", start: 3, end: 5 }, { type: "PER", start: 0, end: 1 }])).toEqual(["B-PER", "O", "O", "B-LOC", "I-LOC"]);
    expect(toIob2(["I-PER", "I-PER", "B-PER", "O", "I-LOC"])).toEqual(["B-PER", "I-PER", "B-PER", "O", "B-LOC"]);
  });

  it("rejects overlapping, empty and out-of-range chunks", () => {
    expect(() => chunksToTags(4, [{ type: "A", start: 0, end: 2 }, { type: "B", start: 1, end: 3 }])).toThrow(/overlap at token 1/);
    expect(() => chunksToTags(4, [{ type: "A", start: 2, end: 2 }])).toThrow(RangeError);
    expect(() => chunksToTags(4, [{ type: "A", start: 3, end: 5 }])).toThrow(/does not fit a sequence of 4/);
  });

  const chunkList = (length: number): fc.Arbitrary<Chunk[]> =>
    fc.uniqueArray(fc.integer({ min: 0, max: length }), { maxLength: length + 1 }).chain((cuts) => {
      const points = [...cuts].sort((a, b) => a - b);
      const pairs: Array<[number, number]> = [];
      for (let k = 0; k + 1 < points.length; k += 2) pairs.push([points[k], points[k + 1]]);
      return fc.tuple(...pairs.map(([s, e]) => fc.constantFrom("PER", "LOC", "B-X").map((type) => ({ type, start: s, end: e }))));
    });

  it("property: chunks → tags → chunks is the identity", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 30 }).chain((n) => fc.tuple(fc.constant(n), chunkList(n))),
        ([n, chunks]) => {
          expect(tagsToChunks(chunksToTags(n, chunks))).toEqual(chunks);
        },
      ),
      { seed: 2101, numRuns: 300 },
    );
  });

  it("property: toIob2 keeps the chunks of any IOB sequence and is idempotent", () => {
    const tags = fc.array(fc.constantFrom("O", "B-PER", "I-PER", "B-LOC", "I-LOC"), { maxLength: 30 });
    fc.assert(
      fc.property(tags, (t) => {
        const iob2 = toIob2(t);
        expect(tagsToChunks(iob2)).toEqual(tagsToChunks(t));
        expect(toIob2(iob2)).toEqual(iob2);
        // IOB2: every chunk's first token is B-.
        for (const c of tagsToChunks(iob2)) expect(iob2[c.start]).toBe(`B-${c.type}`);
      }),
      { seed: 2102, numRuns: 300 },
    );
  });
});

describe("spansToTags and tagsToSpans", () => {
  const text = "Ona Veldrace met Caddric Vobbane in Varnok.";
  const { tokens } = tokenizeText(text);

  it("tags tokens inside spans and reads the spans back", () => {
    const spans: CharSpan[] = [
      { start: 36, end: 42, type: "LOC" },
      { start: 0, end: 12, type: "PER" },
      { start: 17, end: 32, type: "PER" },
    ];
    const tags = spansToTags(tokens, spans);
    expect(tags).toEqual(["B-PER", "I-PER", "O", "B-PER", "I-PER", "O", "B-LOC", "O"]);
    expect(tagsToSpans(tokens, tags)).toEqual([spans[1], spans[2], spans[0]]);
  });

  it("grows a span that cuts through a token to the whole token, and ignores spans on no token", () => {
    const tags = spansToTags(tokens, [
      { start: 2, end: 6, type: "PER" },
      { start: 12, end: 13, type: "X" },
      { start: 20, end: 20, type: "Y" },
    ]);
    expect(tags).toEqual(["B-PER", "I-PER", "O", "O", "O", "O", "O", "O"]);
    expect(tagsToSpans(tokens, tags)).toEqual([{ start: 0, end: 12, type: "PER" }]);
  });

  it("throws on overlapping spans and on spans that come to share a token, naming them", () => {
    expect(() => spansToTags(tokens, [{ start: 0, end: 12, type: "PER" }, { start: 4, end: 16, type: "ORG" }])).toThrow(
      "spans PER [0, 12) and ORG [4, 16) overlap",
    );
    expect(() => spansToTags(tokens, [{ start: 0, end: 6, type: "PER" }, { start: 6, end: 12, type: "ORG" }])).toThrow(
      "spans PER [0, 6) and ORG [6, 12) both cover token 1",
    );
    expect(() => tagsToSpans(tokens, ["O"])).toThrow(RangeError);
  });

  const tokensAndSpans = fc
    .array(fc.tuple(fc.constantFrom("word", "Zoë", "😀", "日本", "a", ".", "مرحبا"), fc.constantFrom(" ", "  ", "\n", "")), { minLength: 1, maxLength: 25 })
    .map((parts) => parts.map(([w, s]) => w + s).join(""))
    .chain((t) => {
      const toks = tokenizeText(t).tokens;
      return fc.tuple(
        fc.constant(toks),
        fc.uniqueArray(fc.integer({ min: 0, max: t.length }), { maxLength: 12 }),
        fc.array(fc.constantFrom("PER", "LOC"), { minLength: 6, maxLength: 6 }),
      );
    });

  it("property: token-aligned spans → tags → spans is the identity", () => {
    fc.assert(
      fc.property(tokensAndSpans, ([toks, cuts, types]) => {
        // Use the cut points as token indices to build aligned, non-overlapping spans.
        const points = [...new Set(cuts.map((c) => c % (toks.length + 1)))].sort((a, b) => a - b);
        const spans: CharSpan[] = [];
        for (let k = 0; k + 1 < points.length; k += 2) {
          spans.push({ start: toks[points[k]].start, end: toks[points[k + 1] - 1].end, type: types[(k / 2) % types.length] });
        }
        expect(tagsToSpans(toks, spansToTags(toks, spans))).toEqual(spans);
      }),
      { seed: 2103, numRuns: 300 },
    );
  });

  it("property: any non-overlapping spans come back grown to token edges, or throw for a shared token", () => {
    const grow = (toks: readonly Token[], s: CharSpan): CharSpan | null => {
      const inside = toks.filter((t) => t.start < s.end && t.end > s.start && s.end > s.start);
      return inside.length === 0 ? null : { start: inside[0].start, end: inside[inside.length - 1].end, type: s.type };
    };
    fc.assert(
      fc.property(tokensAndSpans, ([toks, cuts, types]) => {
        const points = [...cuts].sort((a, b) => a - b);
        const spans: CharSpan[] = [];
        for (let k = 0; k + 1 < points.length; k += 2) spans.push({ start: points[k], end: points[k + 1], type: types[(k / 2) % types.length] });
        const expected = spans.map((s) => grow(toks, s)).filter((s): s is CharSpan => s !== null);
        const sharesToken = expected.some((s, k) => k > 0 && s.start < expected[k - 1].end);
        if (sharesToken) {
          expect(() => spansToTags(toks, spans)).toThrow(/both cover token/);
        } else {
          expect(tagsToSpans(toks, spansToTags(toks, spans))).toEqual(expected);
        }
      }),
      { seed: 2104, numRuns: 400 },
    );
  });
});
