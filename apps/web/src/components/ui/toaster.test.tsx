import { act, fireEvent, render, screen, within } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { ToastProvider, useToast } from "./toaster";

let show: ReturnType<typeof useToast>["show"] = () => undefined;
function Grab() {
  show = useToast().show;
  return null;
}

/** The provider with fake timers; returns the toast region. */
function renderToaster(): HTMLElement {
  vi.useFakeTimers();
  render(
    <ToastProvider>
      <Grab />
    </ToastProvider>,
  );
  return screen.getByTestId("toast-region");
}

describe("ToastProvider", () => {
  afterEach(() => vi.useRealTimers());

  // The phone layout shows only the region's last toast (CSS; the browser test measures where it
  // lands), so the newest must be last, a repeat must move to the end, and all go by themselves.
  it("keeps the newest toast last, moves a repeated message to the end and lets each go after 6 s", () => {
    const region = renderToaster();
    act(() => show("Cannot reach the server.", "error"));
    act(() => show("Saved.", "success"));
    act(() => show("Cannot reach the server.", "error"));
    expect([...region.children].map((c) => c.textContent)).toEqual(["Saved.", "Cannot reach the server."]);
    expect(within(region).getByRole("alert")).toHaveAttribute("title", "Cannot reach the server.");
    act(() => vi.advanceTimersByTime(6000));
    expect(region).toBeEmptyDOMElement();
  });

  // The phone layout cuts a toast to two lines (CSS line-clamp); a tap shows all of it and keeps
  // it, a second tap lets it go after the usual 6 s.
  it("opens a toast on a tap and keeps it until a second tap", () => {
    const region = renderToaster();
    act(() => show("The file could not be read because its text layer is missing; export it again with text.", "error"));
    const toast = within(region).getByRole("button");
    expect(toast).toHaveAttribute("aria-expanded", "false");
    expect(toast.className).toContain("max-sm:line-clamp-2");
    fireEvent.click(toast);
    expect(toast).toHaveAttribute("aria-expanded", "true");
    expect(toast.className).not.toContain("line-clamp");
    act(() => vi.advanceTimersByTime(20_000));
    expect(within(region).getByRole("alert")).toBeInTheDocument();
    fireEvent.click(toast);
    act(() => vi.advanceTimersByTime(5_900));
    expect(within(region).getByRole("alert")).toBeInTheDocument();
    act(() => vi.advanceTimersByTime(200));
    expect(region).toBeEmptyDOMElement();
  });
});
