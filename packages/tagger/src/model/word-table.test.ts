import { describe, expect, it } from "vitest";
import { createRng } from "../util/random";
import { clearWords, createWordTable, findWord, hashWord, insertWord } from "./word-table";

// Reference: a JavaScript Map per sentence position (what the cache used before), on the same
// stream of lookups and insertions.
describe("word table", () => {
  it("maps (word, position) pairs to values as two Maps would, through growth and clearing", () => {
    const rng = createRng(29);
    const alphabet = ["a", "b", "Z", "é", "ß", "🙂", "\u0000", "-", "1"];
    const vocabulary = Array.from({ length: 3000 }, () => Array.from({ length: rng.nextInt(16) }, () => alphabet[rng.nextInt(alphabet.length)]).join(""));
    const table = createWordTable(4);
    let reference = [new Map<string, number>(), new Map<string, number>()];
    for (let step = 0; step < 40000; step++) {
      if (step === 25000) {
        clearWords(table);
        reference = [new Map(), new Map()];
      }
      // Fresh string objects, as a tokenizer gives: equal text, different identity.
      const word = vocabulary[rng.nextInt(vocabulary.length)].split("").join("");
      const first = rng.next() < 0.3;
      const map = reference[first ? 1 : 0];
      const expected = map.get(word);
      const found = findWord(table, word, first);
      expect(found, `step ${step} ${JSON.stringify(word)} ${first}`).toBe(expected ?? -1);
      if (expected === undefined) {
        const value = rng.nextInt(2 ** 30);
        insertWord(table, word, first, value);
        map.set(word, value);
      }
    }
    expect(table.size).toBe(reference[0].size + reference[1].size);
    // The empty word, words that differ only in position or in one code unit of a surrogate pair,
    // and words just within and just beyond what a slot holds inline (10 code units).
    const small = createWordTable(1);
    insertWord(small, "", false, 0);
    expect(findWord(small, "", true)).toBe(-1);
    insertWord(small, "\ud83d\ude42", true, 1);
    expect(findWord(small, "\ud83d\ude43", true)).toBe(-1);
    expect(findWord(small, "\ud83d\ude42", true)).toBe(1);
    expect(findWord(small, "", false)).toBe(0);
    insertWord(small, "abcdefghij", false, 2);
    insertWord(small, "abcdefghijk", false, 2 ** 30 - 1);
    expect(findWord(small, "abcdefghiJ", false)).toBe(-1);
    expect(findWord(small, "abcdefghijK", false)).toBe(-1);
    expect(findWord(small, "abcdefghij", false)).toBe(2);
    expect(findWord(small, "abcdefghijk", false)).toBe(2 ** 30 - 1);
    expect(() => insertWord(small, "x", false, 2 ** 30)).toThrow(RangeError);
  });

  it("tells apart different words with the same 32-bit hash, stored inline and in the shared code units", () => {
    // Birthday search: among a few hundred thousand words some pairs share a hash.
    for (const length of [6, 14]) {
      const rng = createRng(length);
      const seen = new Map<number, string>();
      let pair: [string, string] | null = null;
      for (let n = 0; n < 600000 && pair === null; n++) {
        const word = Array.from({ length }, () => String.fromCharCode(97 + rng.nextInt(26))).join("");
        const h = hashWord(word, false);
        const other = seen.get(h);
        if (other !== undefined && other !== word) pair = [other, word];
        else seen.set(h, word);
      }
      expect(pair, `a hash collision among words of length ${length}`).not.toBeNull();
      const [a, b] = pair!;
      const table = createWordTable(2);
      insertWord(table, a, false, 0);
      expect(findWord(table, b, false)).toBe(-1);
      insertWord(table, b, false, 1);
      expect(findWord(table, a, false)).toBe(0);
      expect(findWord(table, b, false)).toBe(1);
    }
  });
});
