import { describe, expect, it } from "vitest";
import { planAssignments } from "./batch-plan";

describe("planAssignments", () => {
  it("round robin gives each document k different annotators and balances the load", () => {
    const docs = ["d0", "d1", "d2", "d3", "d4", "d5"];
    const plan = planAssignments(docs, { mode: "round_robin", annotatorIds: ["a", "b", "c"], annotatorsPerDocument: 2 });
    expect(plan).toHaveLength(12);
    expect(plan.filter((p) => p.documentId === "d0").map((p) => p.annotatorId)).toEqual(["a", "b"]);
    expect(plan.filter((p) => p.documentId === "d1").map((p) => p.annotatorId)).toEqual(["c", "a"]);
    expect(plan.filter((p) => p.documentId === "d2").map((p) => p.annotatorId)).toEqual(["b", "c"]);
    for (const d of docs) expect(new Set(plan.filter((p) => p.documentId === d).map((p) => p.annotatorId)).size).toBe(2);
    const load = (a: string) => plan.filter((p) => p.annotatorId === a).length;
    expect([load("a"), load("b"), load("c")]).toEqual([4, 4, 4]);
  });

  it("k = 1 deals documents out in turn", () => {
    const plan = planAssignments(["d0", "d1", "d2"], { mode: "round_robin", annotatorIds: ["a", "b"], annotatorsPerDocument: 1 });
    expect(plan.map((p) => p.annotatorId)).toEqual(["a", "b", "a"]);
  });

  it("by hand keeps the caller's lists in document order", () => {
    const plan = planAssignments(["d0", "d1"], {
      mode: "by_hand",
      documents: [{ documentId: "d1", annotatorIds: ["b"] }, { documentId: "d0", annotatorIds: ["a", "c"] }],
    });
    expect(plan).toEqual([
      { documentId: "d0", annotatorId: "a" },
      { documentId: "d0", annotatorId: "c" },
      { documentId: "d1", annotatorId: "b" },
    ]);
  });
});
