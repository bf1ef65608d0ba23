import { render, screen } from "@testing-library/react";
import { describe, expect, it } from "vitest";
import { UserText } from "./user-text";

describe("UserText", () => {
  it("puts a title with a right-to-left override inside an isolating element, apart from the text beside it", () => {
    // U+202E RIGHT-TO-LEFT OVERRIDE (Unicode Standard Annex #9, §2.2) would flip the rest of the
    // line if it were not isolated; <bdi> is an isolate by the HTML rendering rules (HTML
    // Living Standard, §15.3.5 "Bidirectional text").
    const title = "invoice\u202Efdp.exe";
    render(
      <p data-testid="line">
        <UserText>{title}</UserText> · 3 spans
      </p>,
    );
    const line = screen.getByTestId("line");
    const isolate = line.querySelector("bdi");
    expect(isolate).not.toBeNull();
    expect(isolate!.textContent).toBe(title);
    // The words after the title sit outside the isolate.
    expect(line.textContent).toBe(`${title} · 3 spans`);
    expect(isolate!.contains(line.lastChild)).toBe(false);
  });
});
