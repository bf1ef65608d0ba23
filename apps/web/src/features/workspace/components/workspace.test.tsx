import type { AssignmentView, SaveAssignmentInput } from "@tagloom/contracts";
import { screen, waitFor } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { HttpResponse, http } from "msw";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { server } from "@/testing/server";
import { renderWithProviders } from "@/testing/test-utils";
import { makeTestDoc, testTypes } from "../lib/test-doc";
import { Workspace } from "./workspace";

const ORG = "11111111-1111-4111-8111-111111111111";
const CORPUS = "22222222-2222-4222-8222-222222222222";
const ID = "33333333-3333-4333-8333-333333333333";
const URL = `/api/orgs/${ORG}/corpora/${CORPUS}/assignments/${ID}`;
const text = "Mira Quell met Tobin Vale in Gullhaven .";

const view = (over: Partial<AssignmentView> = {}): AssignmentView => ({
  id: ID,
  corpusId: CORPUS,
  batch: { id: "b", name: "Week 1", dueDate: null },
  annotator: { userId: "u", name: "Ines Marrow" },
  state: "open",
  version: 4,
  canEdit: true,
  reviewComment: null,
  updatedAt: "2030-01-01T00:00:00.000Z",
  document: { id: "d", title: "Depot meeting", text, tokens: makeTestDoc(text) },
  entityTypes: testTypes,
  spans: [],
  suggestions: [],
  dismissedSuggestions: [],
  ...over,
});

// jsdom lays nothing out: give elements a size so that the virtualized text draws its rows.
const realRect = Element.prototype.getBoundingClientRect;
beforeAll(() => {
  Element.prototype.getBoundingClientRect = function () {
    return { x: 0, y: 0, top: 0, left: 0, right: 1000, bottom: 800, width: 1000, height: 800, toJSON: () => ({}) } as DOMRect;
  };
  Object.defineProperty(HTMLElement.prototype, "offsetHeight", { configurable: true, get: () => 800 });
  Object.defineProperty(HTMLElement.prototype, "offsetWidth", { configurable: true, get: () => 1000 });
  Element.prototype.scrollIntoView = () => undefined;
  Object.defineProperty(Element.prototype, "clientHeight", { configurable: true, get: () => 800 });
  Object.defineProperty(Element.prototype, "clientWidth", { configurable: true, get: () => 1000 });
});
afterAll(() => {
  Element.prototype.getBoundingClientRect = realRect;
  delete (HTMLElement.prototype as { offsetHeight?: number }).offsetHeight;
  delete (HTMLElement.prototype as { offsetWidth?: number }).offsetWidth;
  delete (Element.prototype as { clientHeight?: number }).clientHeight;
  delete (Element.prototype as { clientWidth?: number }).clientWidth;
});

const marks = () => [...document.querySelectorAll("mark[data-span]")].map((m) => m.getAttribute("data-type"));

describe("Workspace", () => {
  it("marks a span with the keyboard and saves it with its version", async () => {
    const saves: SaveAssignmentInput[] = [];
    server.use(
      http.put(URL, async ({ request }) => {
        const body = (await request.json()) as SaveAssignmentInput;
        saves.push(body);
        return HttpResponse.json({ version: body.version + 1, state: "in_progress", updatedAt: "2030-01-01T00:00:01.000Z" });
      }),
    );
    renderWithProviders(<Workspace orgId={ORG} view={view()} backLink="back" afterSubmit="next" />);
    const textArea = screen.getByTestId("document-text");
    await waitFor(() => expect(textArea).toHaveFocus());
    await userEvent.keyboard("{Shift>}{ArrowRight}{/Shift}p");
    expect(marks()).toEqual(["PERSON"]);
    expect(await screen.findByText(/^Saved \d/, {}, { timeout: 3000 })).toBeInTheDocument();
    expect(saves).toEqual([{ version: 4, spans: [{ start: 0, end: 10, type: "PERSON", origin: "human" }], dismissedSuggestions: [] }]);
    // An overlapping selection is refused and explained; nothing is saved for it.
    await userEvent.keyboard("{Shift>}{ArrowRight}{/Shift}l");
    expect(screen.getByText(/Spans cannot overlap: "Mira Quell" is already PERSON/)).toBeInTheDocument();
    expect(marks()).toEqual(["PERSON"]);
  });

  it("on a stale version loads the newer spans, keeps mine where they fit and offers the clashing one", async () => {
    const saves: SaveAssignmentInput[] = [];
    server.use(
      http.put(URL, async ({ request }) => {
        const body = (await request.json()) as SaveAssignmentInput;
        saves.push(body);
        if (saves.length === 1) {
          return HttpResponse.json(
            {
              error: {
                code: "stale_version",
                message: "changed",
                details: { version: 9, state: "in_progress", spans: [{ start: 15, end: 25, type: "PLACE", origin: "human" }], dismissedSuggestions: [] },
              },
            },
            { status: 409 },
          );
        }
        return HttpResponse.json({ version: body.version + 1, state: "in_progress", updatedAt: "2030-01-01T00:00:02.000Z" });
      }),
    );
    renderWithProviders(<Workspace orgId={ORG} view={view()} backLink="back" afterSubmit="next" />);
    await waitFor(() => expect(screen.getByTestId("document-text")).toHaveFocus());
    // Mine: PERSON "Mira Quell" (fits) and PERSON "Tobin Vale" (clashes with their PLACE).
    await userEvent.keyboard("{Shift>}{ArrowRight}{/Shift}p{ArrowRight}{ArrowRight}{Shift>}{ArrowRight}{/Shift}p");
    expect(await screen.findByText(/changed elsewhere/, {}, { timeout: 3000 })).toBeInTheDocument();
    expect(screen.getByText(/1 of your unsaved change was re-applied/)).toBeInTheDocument();
    await waitFor(() => expect(saves.length).toBe(2), { timeout: 3000 });
    expect(saves[1]!.version).toBe(9);
    expect(saves[1]!.spans.map((s) => `${s.type}@${s.start}`)).toEqual(["PERSON@0", "PLACE@15"]);
    await userEvent.click(screen.getByRole("button", { name: "Use mine" }));
    expect(marks()).toEqual(["PERSON", "PERSON"]);
    await waitFor(() => expect(saves.length).toBe(3), { timeout: 3000 });
    expect(saves[2]!.spans.map((s) => `${s.type}@${s.start}`)).toEqual(["PERSON@0", "PERSON@15"]);
  });

  it("says when it cannot reach the server and keeps the change to retry", async () => {
    let fail = true;
    server.use(http.put(URL, () => (fail ? HttpResponse.error() : HttpResponse.json({ version: 5, state: "in_progress", updatedAt: "x" }))));
    renderWithProviders(<Workspace orgId={ORG} view={view()} backLink="back" afterSubmit="next" />);
    await waitFor(() => expect(screen.getByTestId("document-text")).toHaveFocus());
    await userEvent.keyboard("p");
    expect(await screen.findByText(/You seem to be offline/, {}, { timeout: 3000 })).toBeInTheDocument();
    fail = false;
    await userEvent.click(screen.getByRole("button", { name: "Retry now" }));
    expect(await screen.findByText(/^Saved \d/, {}, { timeout: 3000 })).toBeInTheDocument();
  });

  it("says when the work was saved after a reload, and 'Submitted' once submitted", async () => {
    server.use(http.post(`${URL}/submit`, () => HttpResponse.json({ version: 5, state: "submitted", updatedAt: "2030-01-01T00:00:02.000Z" })));
    // Opened again after earlier saves (version 4): not "nothing yet" but when it was saved.
    renderWithProviders(<Workspace orgId={ORG} view={view({ state: "in_progress", spans: [{ start: 0, end: 10, type: "PERSON", origin: "human" }] })} backLink="back" afterSubmit="next" />);
    const saved = new Intl.DateTimeFormat(undefined, { timeStyle: "short" }).format(new Date("2030-01-01T00:00:00.000Z"));
    expect(document.querySelector("[data-save-state]")).toHaveTextContent(`Saved ${saved}`);
    await userEvent.click(screen.getByRole("button", { name: "Submit for review" }));
    await userEvent.click(screen.getByRole("button", { name: "Submit" }));
    await waitFor(() => expect(document.querySelector("[data-save-state]")).toHaveTextContent("Submitted"));
    expect(screen.queryByText(/Nothing to save yet|No changes yet/)).toBeNull();
  });

  it("says plainly that nothing is saved yet for work never saved", () => {
    renderWithProviders(<Workspace orgId={ORG} view={view({ version: 0 })} backLink="back" afterSubmit="next" />);
    expect(document.querySelector("[data-save-state]")).toHaveTextContent("Nothing to save yet");
  });

  it("renders guidelines as Markdown in the panel and in the ? dialog, dropping raw HTML and script links", async () => {
    const guideline = "Mark **full names**.\n\n- include titles\n- [bad](javascript:alert(1))\n\n<img src=x onerror=alert(1)>";
    const types = [{ ...testTypes[0]!, guideline }, testTypes[1]!, testTypes[2]!];
    renderWithProviders(<Workspace orgId={ORG} view={view({ entityTypes: types })} backLink="back" afterSubmit="next" />);
    await userEvent.click(screen.getAllByRole("button", { name: "Guide" })[0]!);
    const panel = screen.getByTestId("guideline");
    expect(panel.querySelector("strong")).toHaveTextContent("full names");
    expect(panel.querySelectorAll("li")).toHaveLength(2);
    expect(panel.textContent).not.toContain("**");
    expect(panel.querySelector("img")).toBeNull();
    expect(panel.querySelector("a")?.getAttribute("href") ?? "").not.toMatch(/javascript/i);
    screen.getByTestId("document-text").focus();
    await userEvent.keyboard("?");
    const dialog = await screen.findByRole("dialog");
    expect(dialog.querySelector("strong")).toHaveTextContent("full names");
    expect(dialog.textContent).not.toContain("**");
    expect(dialog.querySelector("img")).toBeNull();
  });

  it("is read-only after submission and shows the reviewer's comment when sent back", async () => {
    renderWithProviders(<Workspace orgId={ORG} view={view({ state: "returned", reviewComment: "Gullhaven is a place." })} backLink="back" afterSubmit="next" />);
    expect(screen.getByText("Gullhaven is a place.")).toBeInTheDocument();
  });
});
