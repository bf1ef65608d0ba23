import { configure, screen } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { HttpResponse, http } from "msw";
import { describe, expect, it, vi } from "vitest";
import { server } from "@/testing/server";
import { renderWithProviders } from "@/testing/test-utils";
import { RandomSplitDialog } from "./random-split-dialog";

// The machines running these tests are shared and busy: give async queries time.
configure({ asyncUtilTimeout: 5000 });

const ORG = "11111111-1111-4111-8111-111111111111";
const CORPUS = "22222222-2222-4222-8222-222222222222";

describe("RandomSplitDialog", () => {
  it("previews the counts, refuses a bad percentage and sends percentage, seed and scope", async () => {
    let body: unknown = null;
    server.use(
      http.post(`/api/orgs/${ORG}/corpora/${CORPUS}/documents/split`, async ({ request }) => {
        body = await request.json();
        return HttpResponse.json({ train: 6, test: 2, cleared: 0 });
      }),
    );
    const onClose = vi.fn();
    renderWithProviders(<RandomSplitDialog orgId={ORG} corpusId={CORPUS} open onClose={onClose} counts={{ all: 15, unassigned: 8 }} />);
    // round(15 × 20 / 100) = 3
    expect(screen.getByText("3 test and 12 train documents.")).toBeInTheDocument();
    const percent = screen.getByLabelText("Test share (%)");
    await userEvent.clear(percent);
    await userEvent.type(percent, "150");
    expect(screen.getByText("Use a whole number from 0 to 100.")).toBeInTheDocument();
    expect(screen.getByRole("button", { name: "Split" })).toBeDisabled();
    await userEvent.clear(percent);
    await userEvent.type(percent, "25");
    await userEvent.clear(screen.getByLabelText("Seed"));
    await userEvent.type(screen.getByLabelText("Seed"), "42");
    await userEvent.selectOptions(screen.getByLabelText("Documents"), "unassigned");
    expect(screen.getByText("2 test and 6 train documents.")).toBeInTheDocument();
    await userEvent.click(screen.getByRole("button", { name: "Split" }));
    expect(await screen.findByText("Split: 6 train, 2 test.")).toBeInTheDocument();
    expect(body).toEqual({ testPercent: 25, seed: 42, scope: "unassigned" });
    expect(onClose).toHaveBeenCalled();
  });
});
