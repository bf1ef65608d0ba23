import type { DocumentListItem } from "@tagloom/contracts";
import { configure, screen, waitFor } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { HttpResponse, http } from "msw";
import { describe, expect, it } from "vitest";
import { server } from "@/testing/server";
import { renderWithProviders } from "@/testing/test-utils";
import { DocumentsTable } from "./documents-table";

// The machines running these tests are shared and busy: give async queries time.
configure({ asyncUtilTimeout: 5000 });

const ORG = "11111111-1111-4111-8111-111111111111";
const CORPUS = "22222222-2222-4222-8222-222222222222";
const base = `/api/orgs/${ORG}/corpora/${CORPUS}`;

const doc = (n: number, extra: Partial<DocumentListItem> = {}): DocumentListItem => ({
  id: `00000000-0000-4000-8000-${String(n).padStart(12, "0")}`,
  corpusId: CORPUS,
  title: `Report ${n}`,
  split: null,
  annotationStatus: "none",
  charCount: 100,
  tokenCount: 20 + n,
  sentenceCount: 2,
  filename: `report-${n}.txt`,
  createdAt: "2026-12-01T10:00:00.000Z",
  ...extra,
});

/** A fake documents API that records each query and answers two pages. */
function fakeDocuments() {
  const queries: URLSearchParams[] = [];
  server.use(
    http.get(`${base}/documents`, ({ request }) => {
      const q = new URL(request.url).searchParams;
      queries.push(q);
      if (q.get("q") === "heron") return HttpResponse.json({ items: [doc(7, { title: "Heron count" })], nextCursor: null });
      if (q.get("cursor") === "page-2") return HttpResponse.json({ items: [doc(3), doc(4)], nextCursor: null });
      return HttpResponse.json({ items: [doc(1), doc(2, { split: "train", annotationStatus: "gold" })], nextCursor: "page-2" });
    }),
  );
  return queries;
}

const render = (canManage = true, onRandomSplit?: () => void) =>
  renderWithProviders(<DocumentsTable orgId={ORG} corpusId={CORPUS} canManage={canManage} refetchMs={false} linkTo={(id) => `/doc/${id}`} onRandomSplit={onRandomSplit} />);

describe("DocumentsTable", () => {
  it("pages by cursor on the server, forward and back", async () => {
    const queries = fakeDocuments();
    render();
    expect(await screen.findByRole("link", { name: "Report 1" })).toHaveAttribute("href", `/doc/${doc(1).id}`);
    expect(screen.getByRole("cell", { name: "Train" })).toBeInTheDocument();
    expect(screen.getByRole("cell", { name: "Gold" })).toBeInTheDocument();
    await userEvent.click(screen.getByRole("button", { name: "Next" }));
    expect(await screen.findByRole("link", { name: "Report 3" })).toBeInTheDocument();
    expect(screen.getByText("Page 2")).toBeInTheDocument();
    expect(queries.at(-1)?.get("cursor")).toBe("page-2");
    expect(screen.getByRole("button", { name: "Next" })).toBeDisabled();
    await userEvent.click(screen.getByRole("button", { name: "Previous" }));
    expect(await screen.findByRole("link", { name: "Report 1" })).toBeInTheDocument();
  });

  it("sends sort, filters and the search words to the server, starting again from the first page", async () => {
    const queries = fakeDocuments();
    render();
    await screen.findByRole("link", { name: "Report 1" });
    await userEvent.click(screen.getByRole("button", { name: "Next" }));
    await screen.findByRole("link", { name: "Report 3" });
    await userEvent.click(screen.getByRole("button", { name: "Sort by Title" }));
    await waitFor(() => expect(queries.at(-1)?.get("sort")).toBe("title"));
    expect(queries.at(-1)?.get("dir")).toBe("asc");
    expect(queries.at(-1)?.get("cursor")).toBeNull();
    await userEvent.click(screen.getByRole("button", { name: "Sort by Title" }));
    await waitFor(() => expect(queries.at(-1)?.get("dir")).toBe("desc"));
    await userEvent.selectOptions(screen.getByLabelText("Split"), "none");
    await userEvent.selectOptions(screen.getByLabelText("Annotation status"), "gold");
    await waitFor(() => expect(queries.at(-1)?.get("status")).toBe("gold"));
    expect(queries.at(-1)?.get("split")).toBe("none");
    await userEvent.type(screen.getByLabelText("Search"), "heron");
    await waitFor(() => expect(queries.at(-1)?.get("q")).toBe("heron"));
    expect(await screen.findByRole("link", { name: "Heron count" })).toBeInTheDocument();
  });

  it("sets the split of the selected documents", async () => {
    fakeDocuments();
    let body: unknown = null;
    server.use(
      http.post(`${base}/documents/split`, async ({ request }) => {
        body = await request.json();
        return HttpResponse.json({ train: 0, test: 2, cleared: 0 });
      }),
    );
    render();
    await userEvent.click(await screen.findByRole("checkbox", { name: "Select Report 1" }));
    await userEvent.click(screen.getByRole("checkbox", { name: "Select Report 2" }));
    expect(screen.getByText("2 selected:")).toBeInTheDocument();
    await userEvent.click(screen.getByRole("button", { name: "Set test" }));
    expect(await screen.findByText("2 documents set to test.")).toBeInTheDocument();
    expect(body).toEqual({ documentIds: [doc(1).id, doc(2).id], split: "test" });
    expect(screen.queryByText("2 selected:")).not.toBeInTheDocument();
  });

  it("hands the selected ids to actions the screen composes in (such as making a batch)", async () => {
    fakeDocuments();
    renderWithProviders(
      <DocumentsTable
        orgId={ORG}
        corpusId={CORPUS}
        canManage
        refetchMs={false}
        linkTo={(id) => `/doc/${id}`}
        selectionActions={(ids) => <a href={`/batch?documents=${ids.join(",")}`}>Batch of {ids.length}</a>}
      />,
    );
    await userEvent.click(await screen.findByRole("checkbox", { name: "Select all on this page" }));
    expect(screen.getByRole("link", { name: "Batch of 2" })).toHaveAttribute("href", `/batch?documents=${doc(1).id},${doc(2).id}`);
  });

  it("offers no selection to members who cannot set splits", async () => {
    fakeDocuments();
    render(false);
    await screen.findByRole("link", { name: "Report 1" });
    expect(screen.queryByRole("checkbox")).not.toBeInTheDocument();
    expect(screen.queryByRole("button", { name: "Random split…" })).not.toBeInTheDocument();
  });
});
