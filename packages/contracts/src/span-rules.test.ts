import { describe, expect, it } from "vitest";
import { checkSpans, findOverlap, lowerBound } from "./span-rules";

// "Ada met Bo in Lund ." tokens: Ada[0,3) met[4,7) Bo[8,10) in[11,13) Lund[14,18) .[19,20)
const tokens = { starts: [0, 4, 8, 11, 14, 19], ends: [3, 7, 10, 13, 18, 20] };
const types = new Set(["PER", "LOC"]);

describe("checkSpans", () => {
  it("accepts flat spans on token boundaries", () => {
    expect(checkSpans([{ start: 0, end: 3, type: "PER" }, { start: 8, end: 18, type: "LOC" }], tokens, 20, types)).toBeNull();
    expect(checkSpans([], tokens, 20, types)).toBeNull();
  });

  it("refuses spans that cut a token, leave the text, or use an unknown type", () => {
    expect(checkSpans([{ start: 1, end: 3, type: "PER" }], tokens, 20, types)?.message).toMatch(/does not begin where a token begins/);
    expect(checkSpans([{ start: 0, end: 2, type: "PER" }], tokens, 20, types)?.message).toMatch(/does not end where a token ends/);
    expect(checkSpans([{ start: 0, end: 4, type: "PER" }], tokens, 20, types)?.message).toMatch(/does not end where a token ends/);
    expect(checkSpans([{ start: 19, end: 25, type: "PER" }], tokens, 20, types)?.message).toMatch(/past the end/);
    expect(checkSpans([{ start: 0, end: 3, type: "ORG" }], tokens, 20, types)?.message).toMatch(/"ORG"/);
  });

  it("refuses overlapping spans and says which", () => {
    const p = checkSpans([{ start: 4, end: 10, type: "LOC" }, { start: 0, end: 7, type: "PER" }], tokens, 20, types);
    expect(p?.message).toMatch(/PER \[0, 7\) and LOC \[4, 10\)/);
    expect(p?.index).toBe(0);
  });
});

describe("findOverlap / lowerBound", () => {
  it("touching spans do not overlap", () => {
    expect(findOverlap([{ start: 0, end: 3, type: "A" }, { start: 3, end: 5, type: "B" }])).toBeNull();
    expect(findOverlap([{ start: 0, end: 3, type: "A" }, { start: 2, end: 5, type: "B" }])).not.toBeNull();
  });
  it("finds the first index at or above the offset", () => {
    expect(lowerBound([0, 4, 8], 0)).toBe(0);
    expect(lowerBound([0, 4, 8], 5)).toBe(2);
    expect(lowerBound([0, 4, 8], 9)).toBe(3);
  });
});
