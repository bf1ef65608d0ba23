import { describe, expect, it } from "vitest";
import { addCount, cloneCountTable, countTableFromEntries, createCountTable, findEntry, getCount } from "./count-table";
import { createRng } from "../util/random";

describe("CountTable", () => {
  it("agrees with a Map on random keys up to 2^53, keeps insertion order and grows (seed printed)", () => {
    const seed = 17;
    const rng = createRng(seed);
    const table = createCountTable(2);
    const reference = new Map<number, number>();
    for (let n = 0; n < 20000; n++) {
      const key = rng.next() < 0.5 ? rng.nextInt(500) : Math.floor(rng.next() * 2 ** 52) * 2 + rng.nextInt(2);
      const value = rng.nextInt(5) + 0.5;
      addCount(table, key, value);
      reference.set(key, (reference.get(key) ?? 0) + value);
    }
    expect(table.size, `seed ${seed}`).toBe(reference.size);
    [...reference.entries()].forEach(([key, value], i) => {
      expect(table.keys[i], `seed ${seed} entry ${i}`).toBe(key);
      expect(table.values[i], `seed ${seed} entry ${i}`).toBe(value);
      expect(getCount(table, key)).toBe(value);
    });
    expect(getCount(table, 2 ** 53 - 1)).toBe(0);
    expect(findEntry(table, 123456789.5)).toBe(-1);
  });

  it("clones and rebuilds from entries with identical contents", () => {
    const table = countTableFromEntries([
      [5, 1],
      [2 ** 40, 2.5],
      [0, 3],
    ]);
    const copy = cloneCountTable(table);
    addCount(copy, 5, 1);
    expect(getCount(table, 5)).toBe(1);
    expect(getCount(copy, 5)).toBe(2);
    expect(Array.from(table.keys.subarray(0, table.size))).toEqual([5, 2 ** 40, 0]);
    expect(() => addCount(table, -1, 1)).toThrow(/not an integer/);
    expect(() => addCount(table, 1.5, 1)).toThrow(/not an integer/);
  });
});
