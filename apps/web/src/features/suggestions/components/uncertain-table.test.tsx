import type { UncertainDocument, UncertainRanking } from "@tagloom/contracts";
import { screen, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { afterEach, describe, expect, it, vi } from "vitest";
import { renderWithProviders } from "@/testing/test-utils";
import { NARROW_QUERY, UncertainTable } from "./uncertain-table";

const doc = (n: number, score: number): UncertainDocument => ({
  id: `00000000-0000-4000-8000-${String(n).padStart(12, "0")}`,
  title: `Report ${n}`,
  tokenCount: 40 + n,
  score,
  leastConfidence: 0.5,
  lowConfidenceSpans: n % 3,
  spans: 4,
  reason: `low-confidence spans: ${n % 3} of 4 (under 60%)`,
});

const ranking: UncertainRanking = {
  tagger: { id: "33333333-3333-4333-8333-333333333333", version: 2 },
  measure: "mean_token_entropy",
  threshold: 0.6,
  considered: 12,
  items: Array.from({ length: 12 }, (_, i) => doc(i + 1, 0.9 - i * 0.05)),
};

const batchLink = (ids: string[]) => `/batch?documents=${ids.join(",")}`;
const idsIn = (href: string | null) => new URL(href!, "http://x").searchParams.get("documents")!.split(",");

describe("UncertainTable", () => {
  it("ranks as given, selects the top N and links the batch form with exactly the selected documents", async () => {
    renderWithProviders(<UncertainTable ranking={ranking} linkTo={(id) => `/doc/${id}`} batchLink={batchLink} />);
    const table = screen.getByRole("table", { name: "Most uncertain documents" });
    const rows = within(table).getAllByRole("row").slice(1);
    expect(rows.map((r) => within(r).getByRole("link").textContent)).toEqual(ranking.items.map((d) => d.title));
    expect(within(rows[0]!).getByText("0.900")).toBeInTheDocument();
    expect(within(rows[1]!).getByText("low-confidence spans: 2 of 4 (under 60%)")).toBeInTheDocument();
    // Ten are selected at first.
    expect(idsIn(screen.getByRole("link", { name: "Make a batch of 10…" }).getAttribute("href"))).toEqual(ranking.items.slice(0, 10).map((d) => d.id));

    const top = screen.getByLabelText("Select the top");
    await userEvent.clear(top);
    await userEvent.type(top, "5");
    const link = screen.getByRole("link", { name: "Make a batch of 5…" });
    expect(idsIn(link.getAttribute("href"))).toEqual(ranking.items.slice(0, 5).map((d) => d.id));
    expect(screen.getAllByRole("checkbox").map((c) => (c as HTMLInputElement).checked)).toEqual(ranking.items.map((_, i) => i < 5));

    // Untick the second, tick the eighth: the batch keeps the ranking's order.
    await userEvent.click(screen.getByRole("checkbox", { name: "Select Report 2" }));
    await userEvent.click(screen.getByRole("checkbox", { name: "Select Report 8" }));
    const picked = [1, 3, 4, 5, 8].map((n) => ranking.items[n - 1]!.id);
    expect(idsIn(screen.getByRole("link", { name: "Make a batch of 5…" }).getAttribute("href"))).toEqual(picked);

    await userEvent.clear(top);
    expect(screen.queryByRole("link", { name: /Make a batch/ })).toBeNull();
    expect(screen.getByText("Select documents to make a batch.")).toBeInTheDocument();
  });

  it("offers no selection without the right to make batches", () => {
    renderWithProviders(<UncertainTable ranking={ranking} linkTo={(id) => `/doc/${id}`} />);
    expect(screen.queryAllByRole("checkbox")).toHaveLength(0);
    expect(screen.queryByLabelText("Select the top")).toBeNull();
    expect(screen.getAllByRole("row")).toHaveLength(13);
  });

  describe("on a phone-sized screen", () => {
    afterEach(() => vi.unstubAllGlobals());
    /** jsdom has no layout: stand in for the browser's answer to the table's one media query. */
    const screenWidth = (width: number) =>
      vi.stubGlobal("matchMedia", (query: string) => ({
        matches: query === NARROW_QUERY && width < 640,
        media: query,
        addEventListener: () => undefined,
        removeEventListener: () => undefined,
      }));

    it("puts each rank before and each reason under its document name, without Rank and Why columns", () => {
      screenWidth(390);
      renderWithProviders(<UncertainTable ranking={ranking} linkTo={(id) => `/doc/${id}`} batchLink={batchLink} />);
      const table = screen.getByRole("table", { name: "Most uncertain documents" });
      expect(within(table).getAllByRole("columnheader").map((h) => h.textContent)).toEqual(["Selected", "Document", "Uncertainty"]);
      const rows = within(table).getAllByRole("row").slice(1);
      rows.forEach((row, i) => {
        const d = ranking.items[i]!;
        expect(within(row).getAllByRole("cell")).toHaveLength(3);
        const nameCell = within(row).getByRole("link", { name: d.title }).closest("td")!;
        expect(nameCell).toHaveTextContent(new RegExp(`^Rank ${i + 1}\\.${d.title}`));
        expect(within(nameCell).getByTestId("uncertain-reason")).toHaveTextContent(`Why: ${d.reason}`);
      });
    });

    it("keeps the Why column at desktop width", () => {
      screenWidth(1440);
      renderWithProviders(<UncertainTable ranking={ranking} linkTo={(id) => `/doc/${id}`} />);
      const table = screen.getByRole("table", { name: "Most uncertain documents" });
      expect(within(table).getAllByRole("columnheader").map((h) => h.textContent)).toEqual(["Rank", "Document", "Uncertainty", "Why"]);
      const first = within(table).getAllByRole("row")[1]!;
      const cells = within(first).getAllByRole("cell");
      expect(cells[3]).toHaveTextContent(ranking.items[0]!.reason);
      expect(within(cells[1]!).queryByTestId("uncertain-reason")).toBeNull();
    });
  });
});
