import { describe, expect, it } from "vitest";
import type { WorkSpan } from "./annotation-store";
import { preferMine, rebase } from "./rebase";

const sp = (start: number, end: number, type: string): WorkSpan => ({ start, end, type, origin: "human" });

describe("rebase", () => {
  it("re-applies my additions and removals onto the newer version and reports overlaps", () => {
    const base = { spans: [sp(0, 4, "A"), sp(10, 14, "B")], dismissed: [] };
    const mine = { spans: [sp(10, 14, "B"), sp(20, 24, "C"), sp(30, 34, "D")], dismissed: [{ start: 40, end: 44, type: "E" }] };
    const theirs = { spans: [sp(0, 4, "A"), sp(10, 14, "B"), sp(31, 36, "X")], dismissed: [] };
    const r = rebase(base, mine, theirs);
    expect(r.merged.spans).toEqual([sp(10, 14, "B"), sp(20, 24, "C"), sp(31, 36, "X")]);
    expect(r.merged.dismissed).toEqual([{ start: 40, end: 44, type: "E" }]);
    expect(r.conflicts).toEqual([{ mine: sp(30, 34, "D"), theirs: [sp(31, 36, "X")] }]);
    expect(r.reapplied).toBe(3);
    expect(preferMine(r.merged, r.conflicts[0]!).spans).toEqual([sp(10, 14, "B"), sp(20, 24, "C"), sp(30, 34, "D")]);
  });

  it("with nothing unsaved, the newer version is taken as it is", () => {
    const base = { spans: [sp(0, 4, "A")], dismissed: [] };
    const theirs = { spans: [sp(5, 9, "B")], dismissed: [] };
    expect(rebase(base, base, theirs)).toEqual({ merged: theirs, conflicts: [], reapplied: 0 });
  });
});
