import type { CorpusDetail, FilePage, FileState, UploadFile, UploadLimits, UploadResult } from "@tagloom/contracts";
import { configure, screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { HttpResponse, http } from "msw";
import type { ReactNode } from "react";
import { Route, Routes } from "react-router";
import { describe, expect, it } from "vitest";
import { paths } from "@/config/paths";
import { useMe } from "@/features/auth/api/get-me";
import { server } from "@/testing/server";
import { renderWithProviders } from "@/testing/test-utils";
import { CorpusLayoutRoute } from "./corpus-layout";
import { CorpusUploadsRoute } from "./corpus-uploads";

// The machines running these tests are shared and busy: give the polling time.
configure({ asyncUtilTimeout: 8000 });

const ORG = "11111111-1111-4111-8111-111111111111";
const CORPUS = "22222222-2222-4222-8222-222222222222";
const UPLOAD = "33333333-3333-4333-8333-333333333333";
const base = `/api/orgs/${ORG}/corpora/${CORPUS}`;
const limits: UploadLimits = { maxFileBytes: 1024, maxFilesPerUpload: 5, maxUploadBytes: 4096, maxDocumentChars: 1000, extensions: [".txt"] };

/**
 * A small server whose one uploaded file moves through the states when the test says so; every
 * endpoint answers from the same moment, as the real API reads one database.
 */
function fakeServer() {
  const world = { uploaded: false, state: "queued" as FileState };
  const file = (): UploadFile => ({
    id: "f1",
    uploadId: UPLOAD,
    fileIndex: 0,
    filename: "tide-notes.txt",
    format: "txt",
    sizeBytes: 12,
    state: world.state,
    error: null,
    problems: [],
    documentsCreated: world.state === "ready" ? 1 : 0,
    createdAt: "2026-12-01T10:00:00.000Z",
    finishedAt: null,
  });
  const counts = () => {
    const c: Record<FileState, number> = { queued: 0, processing: 0, ready: 0, failed: 0 };
    if (world.uploaded) c[world.state] += 1;
    return c;
  };
  const upload = (): UploadResult => ({
    upload: { id: UPLOAD, corpusId: CORPUS, spanMode: "gold", defaultSplit: null, createdBy: null, createdAt: "2026-12-01T10:00:00.000Z", counts: counts() },
    files: [file()],
  });
  const docs = () => (world.uploaded && world.state === "ready" ? 1 : 0);
  const corpus = (): CorpusDetail => ({
    id: CORPUS,
    name: "Tide notes",
    description: "",
    archivedAt: null,
    createdAt: "2026-12-01T09:00:00.000Z",
    updatedAt: "2026-12-01T09:00:00.000Z",
    documentCount: docs(),
    entityTypeCount: 1,
    splits: { train: 0, test: 0, none: docs() },
    statuses: { none: docs(), in_progress: 0, submitted: 0, gold: 0 },
    pendingFiles: counts().queued + counts().processing,
  });
  server.use(
    http.get("/api/auth/session", () =>
      HttpResponse.json({ me: { user: { id: "u1", email: "manager@example.test", name: "Ysolde Parrin", emailVerified: true }, memberships: [{ organizationId: ORG, organizationName: "Tide Desk", role: "manager" }] } }),
    ),
    http.get(base, () => HttpResponse.json(corpus())),
    http.get(`${base}/uploads/limits`, () => HttpResponse.json(limits)),
    http.post(`${base}/uploads`, () => {
      world.uploaded = true;
      return HttpResponse.json(upload(), { status: 202 });
    }),
    http.get(`${base}/uploads/${UPLOAD}`, () => HttpResponse.json(upload())),
    http.get(`${base}/files`, () => HttpResponse.json({ items: world.uploaded ? [file()] : [], nextCursor: null, counts: counts() } satisfies FilePage)),
  );
  return world;
}

function SignedIn({ children }: { children: ReactNode }) {
  return useMe().data ? children : null;
}

/** What each of the three places says about the file right now (null: not shown yet). */
function readViews() {
  const header = screen.queryByTestId("corpus-counts")?.textContent ?? null;
  const results = screen.queryByRole("region", { name: "Upload results" });
  const table = screen.queryByRole("table", { name: "Uploaded files" });
  const tableState = table ? (within(table).queryAllByRole("row")[1]?.querySelectorAll("td")[1]?.textContent ?? null) : null;
  const resultState = results?.querySelector('[data-state]')?.getAttribute("data-state") ?? null;
  return {
    headerPending: header === null ? null : /1 file being read/.test(header),
    headerDocuments: header === null ? null : (/^(\d+) documents?/.exec(header)?.[1] ?? null),
    resultState,
    resultSummary: results?.querySelector("[aria-live]")?.textContent ?? null,
    tableState: tableState?.replace(/^[○◐◔●!]/, "") ?? null,
  };
}

type Views = ReturnType<typeof readViews>;
const labels: Record<FileState, string> = { queued: "Waiting", processing: "Reading", ready: "Imported", failed: "Refused" };

/** The three places disagree when one says the file is still being read and another that it is done. */
function disagreement(v: Views): string | null {
  if (v.resultState === null) return null;
  if (v.tableState === null) return `results ${v.resultState}, no file in the table`;
  if (v.headerPending === null) return `results ${v.resultState}, no header`;
  const pendingResult = v.resultState === "queued" || v.resultState === "processing";
  if (v.tableState !== labels[v.resultState as FileState]) return `results ${v.resultState}, table ${v.tableState}`;
  if (v.headerPending !== pendingResult) return `results ${v.resultState}, header ${v.headerPending ? "still reading" : "nothing being read"}`;
  if ((v.headerDocuments === "1") !== (v.resultState === "ready")) return `results ${v.resultState}, header ${v.headerDocuments} documents`;
  return null;
}

describe("the uploads screen after an upload", () => {
  it("tells the same state of the file in the results, the files table and the corpus header at every step", async () => {
    const world = fakeServer();
    renderWithProviders(
      <SignedIn>
        <Routes>
          <Route path={paths.org.corpus.path} element={<CorpusLayoutRoute />}>
            <Route path="uploads" element={<CorpusUploadsRoute />} />
          </Route>
        </Routes>
      </SignedIn>,
      { route: paths.org.corpusUploads.build(ORG, CORPUS) },
    );
    // Every change the page goes through is checked, not only the moments the test looks.
    const seen: string[] = [];
    const observer = new MutationObserver(() => {
      const d = disagreement(readViews());
      if (d) seen.push(d);
    });
    observer.observe(document.body, { subtree: true, childList: true, characterData: true, attributes: true });

    await userEvent.upload(await screen.findByLabelText("Files to upload"), [new File(["Quay at dusk"], "tide-notes.txt")]);
    await userEvent.click(screen.getByRole("button", { name: "Upload 1 file" }));

    const agreeOn = async (state: FileState) =>
      waitFor(() => {
        const v = readViews();
        expect(v.resultState).toBe(state);
        expect(v.tableState).toBe(labels[state]);
        expect(disagreement(v)).toBeNull();
      });
    await agreeOn("queued");
    expect(readViews().resultSummary).toMatch(/^1 of 1 file still being read/);
    world.state = "processing";
    await agreeOn("processing");
    world.state = "ready";
    await agreeOn("ready");
    expect(readViews()).toMatchObject({ headerPending: false, headerDocuments: "1", resultSummary: "All files read: 1 imported, 0 refused." });
    observer.disconnect();
    expect(seen).toEqual([]);
  }, 30_000);
});
