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
  it("chooses nothing for the reviewer and keeps accept disabled until every disagreement is settled", async () => {
    renderWithProviders(<ReviewPanel orgId={ORG} view={view} openLink={() => "#"} onDone={vi.fn()} />);
    const groups = screen.getAllByRole("group", { name: /Settle disagreement/ });
    expect(groups).toHaveLength(2);
    for (const g of groups) for (const radio of within(g).getAllByRole("radio")) expect(radio).not.toBeChecked();
    const accept = screen.getByRole("button", { name: /Accept the settled result/ });
    expect(accept).toBeDisabled();
    expect(screen.getByText(/Settle 2 more disagreements first/)).toBeInTheDocument();
    // Headings name the disputed words, not character offsets.
    expect(screen.getByRole("heading", { name: /“Gullhaven”/ })).toBeInTheDocument();
    expect(screen.getByRole("heading", { name: /“Lowmere Quay”/ })).toBeInTheDocument();
    await userEvent.click(within(groups[0]!).getByRole("radio", { name: /Ines Marrow/ }));
    expect(accept).toBeDisabled();
    expect(screen.getByText(/Settle 1 more disagreement first/)).toBeInTheDocument();
    await userEvent.click(within(groups[1]!).getByRole("radio", { name: /Jory Ashby/ }));
    expect(accept).toBeEnabled();
  });

  it("lets the reviewer choose, edit a span's type and edges, and settles the result", async () => {
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
    expect(screen.getByText("1 span marked identically by everyone is kept as it is.")).toBeInTheDocument();
    const [gull, lowmere] = screen.getAllByRole("group", { name: /Settle disagreement/ });
    await userEvent.click(within(gull!).getByRole("radio", { name: /Jory Ashby/ }));
    // Lowmere: start from Jory's "Lowmere", then edit it and stretch its end by one word.
    await userEvent.click(within(lowmere!).getByRole("radio", { name: /Jory Ashby/ }));
    await userEvent.click(within(lowmere!).getByRole("radio", { name: /Edit/ }));
    expect(within(lowmere!).getAllByTestId("edit-span")).toHaveLength(1);
    // Adding Ines's "Lowmere Quay" as well would overlap: refused with the reason.
    await userEvent.click(within(lowmere!).getByRole("button", { name: /\+ PLACE “Lowmere Quay”/ }));
    expect(screen.getByText(/The settled spans overlap/)).toBeInTheDocument();
    expect(screen.getByRole("button", { name: /Accept the settled result/ })).toBeDisabled();
    await userEvent.click(within(within(lowmere!).getAllByTestId("edit-span")[1]!).getByRole("button", { name: "Remove" }));
    await userEvent.click(within(lowmere!).getByRole("button", { name: "End one word later" }));
    expect(within(lowmere!).getByText("“Lowmere Quay”")).toBeInTheDocument();
    await userEvent.click(within(lowmere!).getByRole("button", { name: "Start one word earlier" }));
    expect(within(lowmere!).getByText("“to Lowmere Quay”")).toBeInTheDocument();
    await userEvent.click(within(lowmere!).getByRole("button", { name: "Start one word later" }));
    await userEvent.selectOptions(within(lowmere!).getByRole("combobox", { name: "Type of “Lowmere Quay”" }), "PERSON");
    await userEvent.click(screen.getByRole("button", { name: "Accept the settled result as gold (3 spans)" }));
    await vi.waitFor(() => expect(done).toHaveBeenCalled());
    expect(body).toEqual({
      spans: [
        { ...at("Edda Rusk"), type: "PERSON" },
        { ...at("Gullhaven"), type: "PLACE" },
        { ...at("Lowmere Quay"), type: "PERSON" },
      ],
    });
  });
});
