import { beforeAll, describe, expect, it, vi } from "vitest";
import { extractPdfFile } from "@/uploads/extract/pdf-file";
import { FileRefusal } from "@/uploads/extract/refusal";
import { uploadFiles, waitForUpload } from "./support/corpora";
import { makePdf } from "./support/files/pdf";
import type { SignedIn } from "./support/http";
import { countDocuments, startManagerCorpus } from "./support/manager-corpus";

vi.hoisted(() => {
  process.env.UPLOAD_MAX_PDF_PAGES = "5";
  process.env.UPLOAD_MAX_DOCUMENT_CHARS = "2000";
});

let admin: SignedIn;
let manager: SignedIn;
let corpusId: string;

beforeAll(async () => {
  ({ admin, manager, corpusId } = await startManagerCorpus("Ossery Print Room", "PDF limits", ["PARTY"]));
});

const documentCount = () => countDocuments(corpusId);
const line = "Deliveries from Harrowend Mills are logged here.";

describe("PDF limits", () => {
  it("refuses a PDF over the page limit and one over the text limit, and imports the good one beside them", async () => {
    const before = await documentCount();
    const longPages = Array.from({ length: 4 }, () => Array.from({ length: 20 }, () => line)); // ~3,900 characters
    const res = await uploadFiles(manager.agent, admin.orgId, corpusId, [
      { name: "six-pages.pdf", content: makePdf(Array.from({ length: 6 }, (_, i) => [`Page ${i + 1}.`])) },
      { name: "long.pdf", content: makePdf(longPages) },
      { name: "fine.pdf", content: makePdf([[line], [line]]) },
    ]);
    expect(res.status).toBe(202);
    const result = await waitForUpload(manager.agent, admin.orgId, corpusId, res.body.upload.id);
    const byName = Object.fromEntries(result.files.map((f) => [f.filename, f]));
    expect(byName["six-pages.pdf"]).toMatchObject({ state: "failed", documentsCreated: 0, error: "has 6 pages; a PDF may have at most 5" });
    expect(byName["long.pdf"]).toMatchObject({ state: "failed", documentsCreated: 0 });
    expect(byName["long.pdf"]!.error).toMatch(/^has more than 2,000 characters of text \(reading stopped at page 3 of 4\)/);
    expect(byName["fine.pdf"]).toMatchObject({ state: "ready", documentsCreated: 1 });
    expect(await documentCount()).toBe(before + 1);
  });

  it("stops reading when the time limit has passed", async () => {
    const ctx = { filename: "slow.pdf", knownTypes: new Set<string>(), maxDocumentChars: 2000, maxDocxEntries: 10, maxDocxUnpackedBytes: 1e6, maxPdfPages: 5 };
    // A limit of 0 ms has passed before the first page: deterministic, no clock race.
    const refused = await extractPdfFile(makePdf([[line]]), { ...ctx, extractTimeLimitMs: 0 }).catch((e: unknown) => e);
    expect(refused).toBeInstanceOf(FileRefusal);
    expect((refused as FileRefusal).reason).toMatch(/^took longer than 0 s to read \(stopped at page 1 of 1\)/);
    expect(await extractPdfFile(makePdf([[line]]), { ...ctx, extractTimeLimitMs: 60_000 })).toEqual([{ sourceIndex: 0, title: "slow", text: line }]);
  });
});
