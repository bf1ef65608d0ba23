import { describe, expect, it } from "vitest";
import { compareAnnotations, settleComparison } from "./annotation-review";

const s = (start: number, end: number, type: string) => ({ start, end, type });

describe("compareAnnotations", () => {
  it("keeps spans every annotator marked identically as agreed", () => {
    const c = compareAnnotations([
      { key: "a", spans: [s(0, 3, "PER"), s(10, 14, "LOC")] },
      { key: "b", spans: [s(10, 14, "LOC"), s(0, 3, "PER")] },
    ]);
    expect(c.agreed).toEqual([s(0, 3, "PER"), s(10, 14, "LOC")]);
    expect(c.disagreements).toEqual([]);
  });

  it("groups a type mismatch, a partial overlap and a span only one annotator marked", () => {
    const c = compareAnnotations([
      { key: "a", spans: [s(0, 3, "PER"), s(10, 14, "LOC"), s(30, 35, "ORG")] },
      { key: "b", spans: [s(0, 3, "ORG"), s(8, 14, "LOC"), s(20, 25, "PER")] },
    ]);
    expect(c.agreed).toEqual([]);
    expect(c.disagreements).toEqual([
      { id: "0-3", start: 0, end: 3, versions: [{ key: "a", spans: [s(0, 3, "PER")] }, { key: "b", spans: [s(0, 3, "ORG")] }] },
      { id: "8-14", start: 8, end: 14, versions: [{ key: "a", spans: [s(10, 14, "LOC")] }, { key: "b", spans: [s(8, 14, "LOC")] }] },
      { id: "20-25", start: 20, end: 25, versions: [{ key: "a", spans: [] }, { key: "b", spans: [s(20, 25, "PER")] }] },
      { id: "30-35", start: 30, end: 35, versions: [{ key: "a", spans: [s(30, 35, "ORG")] }, { key: "b", spans: [] }] },
    ]);
  });

  it("with three annotators a span two of them share is still a disagreement", () => {
    const c = compareAnnotations([
      { key: "a", spans: [s(0, 3, "PER")] },
      { key: "b", spans: [s(0, 3, "PER")] },
      { key: "c", spans: [] },
    ]);
    expect(c.agreed).toEqual([]);
    expect(c.disagreements[0]?.versions.map((v) => v.spans.length)).toEqual([1, 1, 0]);
  });

  it("chains overlapping spans into one stretch", () => {
    const c = compareAnnotations([
      { key: "a", spans: [s(0, 5, "X"), s(6, 9, "X")] },
      { key: "b", spans: [s(3, 7, "X")] },
    ]);
    expect(c.disagreements).toHaveLength(1);
    expect(c.disagreements[0]).toMatchObject({ start: 0, end: 9 });
  });

  it("settles with the chosen versions and the agreed spans", () => {
    const c = compareAnnotations([
      { key: "a", spans: [s(0, 3, "PER"), s(10, 14, "LOC")] },
      { key: "b", spans: [s(0, 3, "ORG"), s(10, 14, "LOC")] },
    ]);
    expect(settleComparison(c, new Map([["0-3", [s(0, 3, "ORG")]]]))).toEqual([s(0, 3, "ORG"), s(10, 14, "LOC")]);
    expect(settleComparison(c, new Map())).toEqual([s(10, 14, "LOC")]);
  });
});
