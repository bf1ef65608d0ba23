import { describe, expect, it } from "vitest";
import { GROUP_LIMITS, planFileGroups } from "./file-groups";

const file = (i: number, format: "txt" | "pdf" | "docx" = "txt", sizeBytes = 2000) => ({ id: `f${i}`, sizeBytes, format });

describe("planFileGroups", () => {
  it("puts many small text files in few groups, keeping upload order and every file once", () => {
    const files = Array.from({ length: 1234 }, (_, i) => file(i));
    const groups = planFileGroups(files);
    expect(groups.map((g) => g.length)).toEqual([500, 500, 234]);
    expect(groups.flat()).toEqual(files.map((f) => f.id));
  });

  it("caps the bytes of a group and never splits a file", () => {
    const big = GROUP_LIMITS.bytes / 2 + 1;
    const groups = planFileGroups([file(0, "txt", big), file(1, "txt", big), file(2, "txt", GROUP_LIMITS.bytes * 3)]);
    expect(groups).toEqual([["f0"], ["f1"], ["f2"]]);
  });

  it("spreads PDFs and DOCX files over more groups", () => {
    const groups = planFileGroups(Array.from({ length: 25 }, (_, i) => file(i, "pdf")));
    expect(groups.map((g) => g.length)).toEqual([10, 10, 5]);
    expect(planFileGroups([])).toEqual([]);
  });
});
