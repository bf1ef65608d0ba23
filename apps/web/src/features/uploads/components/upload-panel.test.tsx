import type { UploadFile, UploadLimits, UploadResult } from "@tagloom/contracts";
import { configure, screen, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { HttpResponse, http } from "msw";
import type { ReactNode } from "react";
import { describe, expect, it } from "vitest";
import { useFileViewsSync } from "../api/sync-file-views";
import { server } from "@/testing/server";
import { renderWithProviders } from "@/testing/test-utils";
import { planUploads } from "./plan-uploads";
import { UploadPanel } from "./upload-panel";

// The machines running these tests are shared and busy: give async queries time.
configure({ asyncUtilTimeout: 5000 });

const ORG = "11111111-1111-4111-8111-111111111111";
const CORPUS = "22222222-2222-4222-8222-222222222222";
const base = `/api/orgs/${ORG}/corpora/${CORPUS}`;
const limits: UploadLimits = { maxFileBytes: 1024, maxFilesPerUpload: 2, maxUploadBytes: 4096, maxDocumentChars: 1000, extensions: [".txt", ".pdf", ".jsonl"] };

const file = (id: string, filename: string, state: UploadFile["state"], extra: Partial<UploadFile> = {}): UploadFile => ({
  id,
  uploadId: "u1",
  fileIndex: Number(id.slice(1)),
  filename,
  format: "txt",
  sizeBytes: 10,
  state,
  error: null,
  problems: [],
  documentsCreated: 0,
  createdAt: "2026-12-01T10:00:00.000Z",
  finishedAt: null,
  ...extra,
});

function result(uploadId: string, files: UploadFile[]): UploadResult {
  const counts = { queued: 0, processing: 0, ready: 0, failed: 0 };
  for (const f of files) counts[f.state] += 1;
  return { upload: { id: uploadId, corpusId: CORPUS, spanMode: "gold", defaultSplit: null, createdBy: null, createdAt: "2026-12-01T10:00:00.000Z", counts }, files };
}

describe("planUploads", () => {
  it("splits files into requests within the limits and sets aside what would be refused", () => {
    const f = (name: string, size: number) => new File(["x".repeat(size)], name);
    const { batches, refused } = planUploads([f("a.txt", 10), f("b.txt", 10), f("c.txt", 10), f("big.txt", 2000), f("x.png", 5)], limits);
    expect(batches.map((b) => b.map((x) => x.name))).toEqual([["a.txt", "b.txt"], ["c.txt"]]);
    expect(refused.map((r) => [r.filename, r.reason])).toEqual([
      ["big.txt", "is 2 KB; a file may be at most 1 KB"],
      ["x.png", "has the ending .png, which we do not read; use one of .txt, .pdf, .jsonl"],
    ]);
  });
});

/** The corpus frame's clock, which refreshes upload results while files are pending. */
function WithClock({ children }: { children: ReactNode }) {
  useFileViewsSync(ORG, CORPUS, true);
  return children;
}

describe("UploadPanel", () => {
  it("shows the limits and the personal-data caution, sends the chosen files, then each file's result as it settles", async () => {
    let polls = 0;
    // jsdom's FormData reaches the mock server without file names, so requests are told apart by size.
    const sent: Array<{ files: number; spanMode: string | null }> = [];
    const names = [["notes.txt", "bad.jsonl"], ["third.txt"]];
    server.use(
      http.get(`${base}/uploads/limits`, () => HttpResponse.json(limits)),
      http.post(`${base}/uploads`, async ({ request }) => {
        const form = await request.formData();
        sent.push({ files: form.getAll("files").length, spanMode: form.get("spanMode") as string | null });
        const id = `u${sent.length}`;
        return HttpResponse.json(result(id, names[sent.length - 1]!.map((n, i) => file(`f${i}`, n, "queued"))), { status: 202 });
      }),
      http.get(`${base}/uploads/u1`, () => {
        polls += 1;
        return HttpResponse.json(
          polls < 2
            ? result("u1", [file("f0", "notes.txt", "processing"), file("f1", "bad.jsonl", "queued")])
            : result("u1", [
                file("f0", "notes.txt", "ready", { documentsCreated: 1 }),
                file("f1", "bad.jsonl", "failed", {
                  error: "has 2 problems on 2 lines, first on line 3: spans[0] [0, 40) is outside the text (length 17).",
                  problems: [
                    { line: 3, message: "spans[0] [0, 40) is outside the text (length 17)" },
                    { line: 5, message: "not valid JSON" },
                  ],
                }),
              ]),
        );
      }),
      http.get(`${base}/uploads/u2`, () => HttpResponse.json(result("u2", [file("f0", "third.txt", "ready", { documentsCreated: 1 })]))),
    );
    renderWithProviders(
      <WithClock>
        <UploadPanel orgId={ORG} corpusId={CORPUS} />
      </WithClock>,
    );
    expect(await screen.findByTestId("upload-limits")).toHaveTextContent("Up to 1 KB per file, 2 files or 4 KB per request");
    expect(screen.getByText(/Documents may hold personal data/)).toBeInTheDocument();

    const picker = screen.getByLabelText("Files to upload");
    await userEvent.upload(picker, [new File(["hello"], "notes.txt"), new File(["{}"], "bad.jsonl"), new File(["x"], "third.txt"), new File(["y".repeat(2000)], "huge.txt")], {
      applyAccept: false,
    });
    expect(screen.getByText("4 files chosen, 2 KB")).toBeInTheDocument();
    await userEvent.selectOptions(screen.getByLabelText("Spans in JSONL and column files become"), "suggested");
    await userEvent.click(screen.getByRole("button", { name: "Upload 4 files" }));

    const results = await screen.findByRole("region", { name: "Upload results" });
    // The too-large file is not sent; the others go in two requests of at most 2 files.
    expect(sent).toEqual([
      { files: 2, spanMode: "suggested" },
      { files: 1, spanMode: "suggested" },
    ]);
    expect(within(results).getByText("huge.txt is 2 KB; a file may be at most 1 KB")).toBeInTheDocument();
    expect(await within(results).findByText(/bad\.jsonl has 2 problems on 2 lines, first on line 3/, {}, { timeout: 4000 })).toBeInTheDocument();
    // notes.txt (first upload) and third.txt (second upload) each gave one document.
    expect(within(results).getAllByText("1 document imported")).toHaveLength(2);
    await userEvent.click(within(results).getByText("All 2 problems"));
    expect(within(results).getByText("line 5: not valid JSON")).toBeInTheDocument();
    expect(within(results).getByText("All files read: 1 imported, 1 refused.")).toBeInTheDocument();
  });

  it("says why nothing can be uploaded to an archived corpus", async () => {
    server.use(http.get(`${base}/uploads/limits`, () => HttpResponse.json(limits)));
    renderWithProviders(<UploadPanel orgId={ORG} corpusId={CORPUS} disabledReason="This corpus is archived." />);
    expect(await screen.findByText("This corpus is archived.")).toBeInTheDocument();
    expect(screen.getByRole("button", { name: "Choose files…" })).toBeDisabled();
  });
});
