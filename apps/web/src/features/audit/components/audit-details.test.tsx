import { render, screen, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { describe, expect, it } from "vitest";
import { AuditDetails, fieldName } from "./audit-details";

describe("AuditDetails", () => {
  it("folds the fields behind a counted summary and opens them as readable names and values", async () => {
    const { container } = render(<AuditDetails details={{ seatCount: 5, old_role: "annotator", batch: { name: "Spring", size: 3 } }} ip="127.0.0.1" />);
    const summary = screen.getByText("3 details");
    const box = container.querySelector("details")!;
    expect(box.open).toBe(false);
    await userEvent.click(summary);
    expect(box.open).toBe(true);
    const list = within(box);
    expect(list.getByText("seat count").nextElementSibling?.textContent).toBe("5");
    expect(list.getByText("old role").nextElementSibling?.textContent).toBe("annotator");
    // Nested values are shown indented, never as one long line that runs off the table.
    expect(list.getByText("batch").nextElementSibling?.textContent).toBe(JSON.stringify({ name: "Spring", size: 3 }, null, 2));
    expect(list.getByText("from address").nextElementSibling?.textContent).toBe("127.0.0.1");
    expect(container.textContent).not.toContain("seatCount");
  });

  it("says 1 detail, not 1 details, and shows nothing when there is nothing to show", () => {
    const { container, rerender } = render(<AuditDetails details={{ reason: null }} ip={null} />);
    expect(screen.getByText("1 detail")).toBeTruthy();
    expect(screen.getByText("reason").nextElementSibling?.textContent).toBe("—");
    rerender(<AuditDetails details={{}} ip={null} />);
    expect(container.querySelector("details")).toBeNull();
  });

  it("turns camelCase and snake_case keys into words", () => {
    expect(fieldName("pendingInvitations")).toBe("pending invitations");
    expect(fieldName("target_user_id")).toBe("target user id");
  });
});
