import { describe, expect, it } from "vitest";
import { createRng } from "../util/random";
import { clearPairs, createPairTable, getPair, setPair } from "./pair-table";

// Reference: a Map keyed by the pair written as a string, on the same stream of operations.
describe("pair table", () => {
  it("stores and finds pairs as a Map would, through growth, overwriting and clearing", () => {
    const rng = createRng(61);
    const table = createPairTable(2);
    let reference = new Map<string, number>();
    for (let step = 0; step < 60000; step++) {
      if (step === 40000) {
        clearPairs(table);
        reference = new Map();
      }
      // Small ranges make repeats and probe collisions common; a few huge ids test the extremes.
      const first = rng.next() < 0.01 ? 0x7ffffffe : rng.nextInt(300);
      const second = rng.next() < 0.01 ? 0x7fffffff : rng.nextInt(300);
      const key = `${first} ${second}`;
      expect(getPair(table, first, second, -7), `step ${step} (${first}, ${second})`).toBe(reference.get(key) ?? -7);
      if (rng.next() < 0.5) {
        const value = rng.nextInt(1000) - 500;
        setPair(table, first, second, value);
        reference.set(key, value);
      }
      expect(table.size).toBe(reference.size);
    }
    expect(() => setPair(table, -1, 0, 1)).toThrow(RangeError);
    expect(() => setPair(table, 0x7fffffff, 0, 1)).toThrow(RangeError);
    expect(() => setPair(table, 1.5, 0, 1)).toThrow(RangeError);
  });
});
