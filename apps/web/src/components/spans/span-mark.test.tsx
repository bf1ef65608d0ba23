import { render, screen } from "@testing-library/react";
import { describe, expect, it } from "vitest";
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
