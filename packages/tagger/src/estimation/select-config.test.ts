import { describe, expect, it } from "vitest";
import { selectConfiguration } from "./select-config";
import type { ColumnDocument } from "../text/conll";

// A tag sequence with period 4 (X X Y Y X X Y Y) over one repeated word: the next tag is a
// function of the two previous tags but not of the previous tag alone (after X comes X or Y
// equally often). A second-order (trigram) model can decode it exactly, a first-order one cannot
// (Jurafsky & Martin, "Speech and Language Processing", 2nd ed., §5.5.2 on trigram HMM
// taggers; the example is ours).
function periodFour(documents: number, length: number): ColumnDocument[] {
  const pattern = ["X", "X", "Y", "Y"];
  return Array.from({ length: documents }, () => ({
    sentences: [{ words: Array.from({ length }, () => "w"), tags: Array.from({ length }, (_, t) => pattern[t % 4]) }],
  }));
}

describe("selectConfiguration", () => {
  it("chooses the trigram model when the tags need two tags of history", () => {
    const result = selectConfiguration(periodFour(12, 10), {});
    expect(result.skipped).toBeNull();
    expect(result.chosen.name).toBe("trigram");
    const score = Object.fromEntries(result.scores.map((s) => [s.name, s.score]));
    expect(score.trigram).toBe(1);
    expect(score["first-order"]).toBeLessThan(1);
  });

  it("keeps the earlier candidate on a tie (two identical candidates score the same)", () => {
    const result = selectConfiguration(periodFour(12, 10), {}, { candidates: [{ name: "a", config: {} }, { name: "b", config: {} }] });
    expect(result.scores[0].score).toBe(result.scores[1].score);
    expect(result.chosen.name).toBe("a");
  });

  it("selects nothing when the caller fixes the transition model or asks for unlabelled learning", () => {
    expect(selectConfiguration(periodFour(12, 10), { order: 1 }).skipped).toMatch(/order/);
    expect(selectConfiguration(periodFour(12, 10), { semi: "em" }).skipped).toMatch(/first-order/);
    expect(selectConfiguration(periodFour(3, 10), {}).skipped).toMatch(/too few sentences/);
  });
});
