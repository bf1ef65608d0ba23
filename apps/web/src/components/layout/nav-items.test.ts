import { describe, expect, it } from "vitest";
import { areaOf } from "./nav-items";

describe("areaOf", () => {
  const o = "/o/0b7e";
  it("puts batch, review and workspace pages in their own areas, not under Corpora", () => {
    expect(areaOf(`${o}/corpora/c1/batches/b1`)).toBe("batches");
    expect(areaOf(`${o}/corpora/c1/batches/b1/review/d1`)).toBe("review");
    expect(areaOf(`${o}/corpora/c1/assignments/a1`)).toBe("queue");
    expect(areaOf(`${o}/corpora/c1/assignments/a1`, "?from=review")).toBe("review");
    expect(areaOf(`${o}/corpora/c1/documents/d1`)).toBe("corpora");
    expect(areaOf(`${o}/corpora/c1/schema`)).toBe("corpora");
    expect(areaOf(`${o}/batches/new`)).toBe("batches");
    expect(areaOf(`${o}/corpora/c1/training`)).toBe("taggers");
    expect(areaOf(`${o}/corpora/c1/training/taggers/t1/compare/t2`)).toBe("taggers");
    expect(areaOf(o)).toBe("overview");
    expect(areaOf(`${o}/`)).toBe("overview");
  });
});
