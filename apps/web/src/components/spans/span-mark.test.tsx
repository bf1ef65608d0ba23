import { render, screen } from "@testing-library/react";
import { describe, expect, it } from "vitest";
import { SpanMark } from "./span-mark";
import { SpanText } from "./span-text";
import { typeCodes } from "./type-codes";

describe("typeCodes", () => {
  it("keeps short names, shortens long ones, and never gives two types one code", () => {
    const codes = typeCodes(["DATE", "PARTY", "PART_NUMBER", "PARTNER", "MONEY"]);
    expect(codes.get("DATE")).toBe("DATE");
    expect(codes.get("PARTY")).toBe("PAR");
    expect(new Set(codes.values()).size).toBe(5);
  });
});

describe("SpanText", () => {
  const text = "Orla Finch paid Tobin Vale on Tuesday.";
  const types = [
    { name: "PERSON", color: "#e69f00" },
    { name: "DATE", color: "#56b4e9" },
  ];
  it("draws each span with its code and its type's name reachable without colour", () => {
    render(
      <SpanText
        text={text}
        spans={[
          { start: 0, end: 10, type: "PERSON" },
          { start: 30, end: 37, type: "DATE" },
        ]}
        types={types}
      />,
    );
    const marks = document.querySelectorAll("mark.tl-span");
    expect(marks).toHaveLength(2);
    expect(marks[0]).toHaveAttribute("title", "PERSON");
    expect(marks[0]!.querySelector(".tl-span-code")).toHaveTextContent("PER");
    // Screen readers hear the type's full name after the text.
    expect(screen.getByText("(PERSON)")).toHaveClass("sr-only");
    expect(marks[1]!.textContent).toContain("Tuesday");
    expect((marks[1] as HTMLElement).style.getPropertyValue("--span-color")).toBe("#56b4e9");
  });
  it("shows only the asked stretch, with ellipses where it is cut", () => {
    const { container } = render(<SpanText text={text} spans={[{ start: 16, end: 26, type: "PERSON" }]} types={types} from={11} to={26} />);
    expect(container.textContent).toBe("…paid PERTobin Vale (PERSON)…");
  });
});

describe("SpanMark line breaking", () => {
  // A line may break after an inline box (CSS Text Level 3, §5.1: atomic inlines are break
  // opportunities like U+FFFC); the code is one, so it travels with the span's first word.
  it("keeps the code and the first word of the span in one unbreakable run, the rest outside it", () => {
    const text = "The harbour master Sefa Lusk wrote.";
    const { container } = render(<SpanText text={text} spans={[{ start: 19, end: 28, type: "PERSON" }]} types={[{ name: "PERSON", color: "#e69f00" }]} />);
    const head = container.querySelector("mark .tl-span-head");
    expect(head).not.toBeNull();
    expect(head!.querySelector(".tl-span-code")).not.toBeNull();
    expect(head!.textContent).toBe("PERSefa");
    expect(container.querySelector("mark")!.textContent).toBe("PERSefa Lusk (PERSON)");
  });

  it("takes the first token element when the span is made of tokens", () => {
    const { container } = render(
      <SpanMark type="PERSON" code="PER" color="#e69f00">
        {[<span key="a">Sefa</span>, <span key="g"> </span>, <span key="b">Lusk</span>]}
      </SpanMark>,
    );
    expect(container.querySelector(".tl-span-head")!.textContent).toBe("PERSefa");
  });
});
