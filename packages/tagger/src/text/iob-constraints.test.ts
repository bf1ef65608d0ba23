import { describe, expect, it } from "vitest";
import { iobConstraints } from "./iob-constraints";

describe("iobConstraints", () => {
  it("forbids I-X at the start, after O and after another type; allows it after B-X and I-X", () => {
    const tags = ["O", "B-PER", "I-PER", "B-LOC", "I-LOC"];
    const { allowed, allowedStart } = iobConstraints(tags);
    const ok = (from: string, to: string) => allowed[tags.indexOf(from) * 5 + tags.indexOf(to)] === 1;
    expect(Array.from(allowedStart)).toEqual([1, 1, 0, 1, 0]);
    expect(ok("O", "I-PER")).toBe(false);
    expect(ok("B-LOC", "I-PER")).toBe(false);
    expect(ok("I-LOC", "I-PER")).toBe(false);
    expect(ok("B-PER", "I-PER")).toBe(true);
    expect(ok("I-PER", "I-PER")).toBe(true);
    expect(ok("I-PER", "B-PER")).toBe(true);
    expect(ok("O", "B-LOC")).toBe(true);
    expect(ok("I-LOC", "O")).toBe(true);
  });
});
