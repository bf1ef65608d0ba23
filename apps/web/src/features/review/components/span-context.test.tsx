import { render } from "@testing-library/react";
import { describe, expect, it } from "vitest";
import { SpanContext } from "./span-context";

const text = "Edda Rusk took the ferry from Gullhaven to Lowmere Quay. The Corran Line owns the ferry.";
const types = [{ name: "ORG", color: "#2f7d5b" }];

describe("SpanContext", () => {
  it("cuts the excerpt at word edges, never inside a word", () => {
    const start = text.indexOf("Corran");
    // 60 characters before "Corran" falls inside "Edda"; the excerpt takes the whole word.
    expect(text.slice(start - 60, start - 57)).toBe("dda");
    const { container } = render(<SpanContext text={text} start={start} end={start + "Corran Line".length} spans={[]} types={types} />);
    expect(container.textContent).toMatch(/^Edda Rusk took the ferry/);
  });

  it("shows just the span and its words when there is no padding", () => {
    const start = text.indexOf("Lowmere Quay");
    const { container } = render(<SpanContext text={text} start={start} end={start + 12} spans={[]} types={types} pad={0} />);
    expect(container.textContent).toBe("…Lowmere Quay.…");
  });
});
