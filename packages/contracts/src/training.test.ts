import { describe, expect, it } from "vitest";
import { can } from "./accounts";
import { runStageLabels, runStageNames, runStatusLabels, runStatusNames, startRunInputSchema, taggerLabel } from "./training";

describe("training abilities", () => {
  // Decided for issue 9: data leads and admins train, cancel, repeat, download and choose the
  // suggester; managers follow runs and taggers read-only; annotators see none of it.
  it("lets data leads and admins train, managers only look, annotators nothing", () => {
    expect(["admin", "data_lead", "manager", "annotator"].map((r) => can(r as never, "train"))).toEqual([true, true, false, false]);
    expect(["admin", "data_lead", "manager", "annotator"].map((r) => can(r as never, "viewTraining"))).toEqual([true, true, true, false]);
    expect(["admin", "data_lead", "manager", "annotator"].map((r) => can(r as never, "downloadTaggers"))).toEqual([true, true, false, false]);
  });
});

describe("startRunInputSchema", () => {
  it("takes an empty body as the defaults", () => {
    expect(startRunInputSchema.parse({})).toEqual({});
  });

  it("names each bad field", () => {
    const r = startRunInputSchema.safeParse({
      smoothing: { emission: -1 },
      positionBuckets: { token: [3, 2], sentence: [] },
      order: 3,
      crossValidationFolds: 1,
      semi: "magic",
      testSplit: { kind: "holdout", percent: 0 },
      seed: 1.5,
      unknownField: true,
    });
    expect(r.success).toBe(false);
    const paths = new Set(r.error!.issues.map((i) => i.path.join(".") || String((i as { keys?: string[] }).keys)));
    expect(paths).toEqual(
      new Set(["smoothing.emission", "positionBuckets.token", "order", "crossValidationFolds", "semi", "testSplit.percent", "seed", "unknownField"]),
    );
  });

  it("refuses EM or sampling with a second-order model", () => {
    const r = startRunInputSchema.safeParse({ order: 2, semi: "em" });
    expect(r.error?.issues.map((i) => i.path.join("."))).toEqual(["semi"]);
    expect(startRunInputSchema.safeParse({ order: 2, semi: "none" }).success).toBe(true);
  });

  it("accepts a full form", () => {
    const input = {
      smoothing: { start: 1, transition: 0.5, emission: 0.1 },
      positionBuckets: { token: [1, 2, 4], sentence: [1] },
      positionStrength: 5,
      rare: 2,
      wordClasses: "bikel",
      suffixLength: 3,
      order: 1,
      prevWord: false,
      contextEmissions: false,
      crossValidationFolds: null,
      semi: "sample",
      iterations: 3,
      weight: 0.5,
      testSplit: { kind: "holdout", percent: 20 },
      seed: 7,
    };
    expect(startRunInputSchema.parse(input)).toEqual(input);
  });
});

describe("labels", () => {
  it("has a label for every state and stage, and names taggers by version", () => {
    expect(Object.keys(runStatusLabels)).toEqual([...runStatusNames]);
    expect(Object.keys(runStageLabels)).toEqual([...runStageNames]);
    expect(taggerLabel(3, "Harbour filings")).toBe("Tagger v3 of Harbour filings");
  });
});
