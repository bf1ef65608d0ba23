import { describe, expect, it } from "vitest";
import { findSpanProblems } from "./span-checks";

const types = new Set(["PARTY", "PLACE"]);

describe("findSpanProblems", () => {
  it("accepts touching spans in any order", () => {
    expect(findSpanProblems(20, [{ start: 5, end: 10, type: "PLACE" }, { start: 0, end: 5, type: "PARTY" }], types)).toEqual([]);
  });

  it("reports each problem once, by span", () => {
    expect(
      findSpanProblems(10, [
        { start: 0, end: 4, type: "PARTY" },
        { start: 3, end: 6, type: "PLACE" },
        { start: 7, end: 7, type: "PARTY" },
        { start: 8, end: 12, type: "PARTY" },
        { start: 0, end: 2, type: "DATE" },
      ], types),
    ).toEqual([
      "span 3 [7, 7) must end after it starts",
      "span 4 [8, 12) is outside the text (length 10)",
      'span 5 [0, 2) has type "DATE", which is not in the corpus\'s entity schema',
      "span 1 [0, 4) PARTY and span 2 [3, 6) PLACE overlap",
    ]);
  });
});
