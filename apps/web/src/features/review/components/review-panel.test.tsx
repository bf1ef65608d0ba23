import type { ReviewDocumentView } from "@tagloom/contracts";
import { screen, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { HttpResponse, http } from "msw";
import { describe, expect, it, vi } from "vitest";
import { server } from "@/testing/server";
import { renderWithProviders } from "@/testing/test-utils";
import { ReviewPanel } from "./review-panel";

const ORG = "11111111-1111-4111-8111-111111111111";
const text = "Edda Rusk took the ferry from Gullhaven to Lowmere Quay.";
const at = (phrase: string) => ({ start: text.indexOf(phrase), end: text.indexOf(phrase) + phrase.length });

const view: ReviewDocumentView = {
  batch: { id: "b1", name: "Ferry overlap", dueDate: null },
  corpusId: "c1",
  document: { id: "d1", title: "Ferry notes", text, tokens: { starts: [], ends: [], sentenceStarts: [] } },
  entityTypes: [
    { id: "t1", name: "PERSON", color: "#E69F00", hotkey: "p", guideline: "", position: 0 },
    { id: "t2", name: "PLACE", color: "#56B4E9", hotkey: "l", guideline: "", position: 1 },
  ],
  assignments: [
    { id: "a1", annotator: { userId: "u1", name: "Ines Marrow" }, state: "submitted", submittedAt: null, reviewComment: null, spans: [{ ...at("Edda Rusk"), type: "PERSON", origin: "human" }, { ...at("Lowmere Quay"), type: "PLACE", origin: "human" }] },
    { id: "a2", annotator: { userId: "u2", name: "Jory Ashby" }, state: "submitted", submittedAt: null, reviewComment: null, spans: [{ ...at("Edda Rusk"), type: "PERSON", origin: "human" }, { ...at("Lowmere"), type: "PLACE", origin: "human" }, { ...at("Gullhaven"), type: "PLACE", origin: "human" }] },
  ],
  gold: null,
  ready: true,
};

describe("ReviewPanel", () => {
  it("lists disagreements, lets the reviewer choose or edit, and settles the result", async () => {
    let body: unknown = null;
    server.use(
      http.post(`/api/orgs/${ORG}/corpora/c1/batches/b1/documents/d1/settle`, async ({ request }) => {
        body = await request.json();
        return new HttpResponse(null, { status: 204 });
      }),
    );
    const done = vi.fn();
    renderWithProviders(<ReviewPanel orgId={ORG} view={view} openLink={() => "#"} onDone={done} />);
    expect(screen.getByRole("heading", { name: "Disagreements (2)" })).toBeInTheDocument();
    expect(screen.getByText("1 spans marked identically by everyone are kept as they are.")).toBeInTheDocument();
    const [gull, lowmere] = screen.getAllByRole("group", { name: /Settle disagreement/ });
    // Gullhaven: Jory's version. Lowmere: edit, starting from the chosen version (Ines's "Lowmere Quay").
    await userEvent.click(within(gull!).getByRole("radio", { name: /Jory Ashby/ }));
    await userEvent.click(within(lowmere!).getByRole("radio", { name: /Edit/ }));
    expect(within(lowmere!).getByRole("checkbox", { name: 'Keep "Lowmere Quay"' })).toBeChecked();
    // Keeping both would overlap: refused with the reason, and accepting is disabled.
    await userEvent.click(within(lowmere!).getByRole("checkbox", { name: 'Keep "Lowmere"' }));
    expect(screen.getByText(/The settled spans overlap/)).toBeInTheDocument();
    expect(screen.getByRole("button", { name: /Accept the settled result/ })).toBeDisabled();
    await userEvent.click(within(lowmere!).getByRole("checkbox", { name: 'Keep "Lowmere"' }));
    await userEvent.click(screen.getByRole("button", { name: "Accept the settled result as gold (3 spans)" }));
    await vi.waitFor(() => expect(done).toHaveBeenCalled());
    expect(body).toEqual({
      spans: [
        { ...at("Edda Rusk"), type: "PERSON" },
        { ...at("Gullhaven"), type: "PLACE" },
        { ...at("Lowmere Quay"), type: "PLACE" },
      ],
    });
  });
});
