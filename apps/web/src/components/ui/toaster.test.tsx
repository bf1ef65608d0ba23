import { act, render, screen, within } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { ToastProvider, useToast } from "./toaster";

let show: ReturnType<typeof useToast>["show"] = () => undefined;
function Grab() {
  show = useToast().show;
  return null;
}

describe("ToastProvider", () => {
  afterEach(() => vi.useRealTimers());

  // The phone layout shows only the region's last toast (CSS; the browser test measures where it
  // lands), so the newest must be last, a repeat must move to the end, and all go by themselves.
  it("keeps the newest toast last, moves a repeated message to the end and lets each go after 6 s", () => {
    vi.useFakeTimers();
    render(
      <ToastProvider>
        <Grab />
      </ToastProvider>,
    );
    const region = screen.getByTestId("toast-region");
    act(() => show("Cannot reach the server.", "error"));
    act(() => show("Saved.", "success"));
    act(() => show("Cannot reach the server.", "error"));
    expect([...region.children].map((c) => c.textContent)).toEqual(["Saved.", "Cannot reach the server."]);
    expect(within(region).getByRole("alert")).toHaveAttribute("title", "Cannot reach the server.");
    act(() => vi.advanceTimersByTime(6000));
    expect(region).toBeEmptyDOMElement();
  });
});
