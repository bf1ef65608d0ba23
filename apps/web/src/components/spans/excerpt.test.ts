import { describe, expect, it } from "vitest";
import { excerptBounds } from "./excerpt";

const text = "Mira Quell met Tobin Vale at the Saltmarsh depot on Tuesday. Orla Finch signed for Ostrandel Freight.";

describe("excerptBounds", () => {
  it("widens both cuts to whole words", () => {
    const start = text.indexOf("Finch");
    // Ten characters either side cut "Tuesday." and "for" in the middle (worked by hand).
    expect(text.slice(start - 10, start + 15)).toBe("day. Orla Finch signed fo");
    const { from, to } = excerptBounds(text, start, start + 5, 10);
    expect(text.slice(from, to)).toBe("Tuesday. Orla Finch signed for");
  });

  it("stops at the text's ends and leaves a word longer than the slack cut", () => {
    // From the start: nothing before; 30 after "Mira" ends inside "Saltmarsh", which is kept whole.
    const head = excerptBounds(text, 0, 4, 30);
    expect(text.slice(head.from, head.to)).toBe("Mira Quell met Tobin Vale at the Saltmarsh");
    const long = `${"x".repeat(50)} Vale`;
    expect(excerptBounds(long, 51, 55, 10).from).toBe(41);
  });
});
