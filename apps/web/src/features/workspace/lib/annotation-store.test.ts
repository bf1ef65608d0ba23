import { describe, expect, it } from "vitest";
import { AnnotationStore } from "./annotation-store";
import { buildDocIndex } from "./doc-index";
import { makeTestDoc, testTypes } from "./test-doc";

const text = "Mira Quell met Tobin Vale in Gullhaven . They left .\n\nA new paragraph starts here .";

function makeStore(suggestions = [] as Array<{ start: number; end: number; type: string; confidence: number }>) {
  return new AnnotationStore(buildDocIndex(text, makeTestDoc(text)), testTypes, { spans: [], dismissed: [] }, suggestions, false);
}

describe("AnnotationStore", () => {
  it("marks a keyboard selection, snapping to whole tokens", () => {
    const s = makeStore();
    s.moveCursor(0);
    s.moveCursorBy(1, true);
    expect(s.selectionText()).toBe("Mira Quell");
    expect(s.label("PERSON")).toBe(true);
    expect(s.spans).toEqual([{ start: 0, end: 10, type: "PERSON", origin: "human" }]);
    expect(s.anchor).toBeNull();
  });

  it("refuses an overlapping selection and says why; an exact reselection changes the type", () => {
    const s = makeStore();
    s.select(0, 1);
    s.label("PERSON");
    s.select(1, 2);
    expect(s.label("PLACE")).toBe(false);
    expect(s.message?.text).toMatch(/cannot overlap: "Mira Quell" is already PERSON/);
    expect(s.spans).toHaveLength(1);
    s.select(0, 1);
    expect(s.label("ORG")).toBe(true);
    expect(s.spans[0]?.type).toBe("ORG");
    // With nothing selected, a type key on a span retypes it.
    s.moveCursor(1);
    s.label("PLACE");
    expect(s.spans[0]?.type).toBe("PLACE");
  });

  it("undoes and redoes, and only touches the rows a change reaches", () => {
    const s = makeStore();
    const lastRow = s.doc.blocks.length - 1;
    expect(lastRow).toBeGreaterThan(0);
    const before = s.blockVersion(lastRow);
    s.select(3, 4);
    s.label("PERSON");
    s.moveCursor(6);
    s.label("PLACE");
    expect(s.spans.map((x) => x.type)).toEqual(["PERSON", "PLACE"]);
    expect(s.blockVersion(lastRow)).toBe(before);
    s.undo();
    expect(s.spans.map((x) => x.type)).toEqual(["PERSON"]);
    s.redo();
    expect(s.spans.map((x) => x.type)).toEqual(["PERSON", "PLACE"]);
    s.moveCursor(3);
    s.removeAtCursor();
    expect(s.spans.map((x) => x.type)).toEqual(["PLACE"]);
    s.undo();
    expect(s.spans).toHaveLength(2);
  });

  it("accepts and rejects suggestions, one or all at or above a confidence", () => {
    const s = makeStore([
      { start: 0, end: 10, type: "PERSON", confidence: 0.9 },
      { start: 15, end: 25, type: "PERSON", confidence: 0.6 },
      { start: 29, end: 38, type: "PLACE", confidence: 0.3 },
    ]);
    expect(s.pendingSuggestions).toHaveLength(3);
    expect(s.acceptSuggestions(s.pendingSuggestions.filter((x) => x.confidence >= 0.5))).toBe(2);
    expect(s.spans.map((x) => x.origin)).toEqual(["suggested", "suggested"]);
    expect(s.pendingSuggestions).toHaveLength(1);
    s.moveCursor(6);
    expect(s.suggestionAtToken(6)?.type).toBe("PLACE");
    s.removeAtCursor();
    expect(s.pendingSuggestions).toHaveLength(0);
    expect(s.snapshot.dismissed).toEqual([{ start: 29, end: 38, type: "PLACE" }]);
    s.undo();
    expect(s.pendingSuggestions).toHaveLength(1);
  });

  it("refuses edits when read-only", () => {
    const s = new AnnotationStore(buildDocIndex(text, makeTestDoc(text)), testTypes, { spans: [], dismissed: [] }, [], true);
    s.moveCursor(0);
    expect(s.label("PERSON")).toBe(false);
    expect(s.message?.text).toMatch(/read-only/);
  });
});
