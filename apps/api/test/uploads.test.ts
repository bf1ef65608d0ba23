import type { DocumentDetail, DocumentListItem, UploadFile } from "@tagloom/contracts";
import { beforeAll, describe, expect, it, vi } from "vitest";
import { createCorpusWithTypes, uploadAndWait, uploadFiles } from "./support/corpora";
import { makeDocx } from "./support/files/docx";
import { makeEncryptedPdf, makeImageOnlyPdf, makePdf } from "./support/files/pdf";
import { type SignedIn, type TestServer, addSignedInMember } from "./support/http";
import { startManagerCorpus } from "./support/manager-corpus";

// Small limits so the tests can cross them; read by config/env.ts when the app is imported.
vi.hoisted(() => {
  process.env.UPLOAD_MAX_FILE_BYTES = String(64 * 1024);
  process.env.UPLOAD_MAX_FILES = "12";
  process.env.UPLOAD_MAX_BYTES = String(512 * 1024);
  process.env.UPLOAD_MAX_DOCUMENT_CHARS = "20000";
});

let server: TestServer;
let admin: SignedIn;
let manager: SignedIn;
let corpusId: string;

beforeAll(async () => {
  ({ server, admin, manager, corpusId } = await startManagerCorpus("Upload Org", "Uploads corpus", ["PARTY", "PLACE"]));
});

const corpusPath = () => `/api/orgs/${admin.orgId}/corpora/${corpusId}`;

async function documentsOfFile(file: UploadFile): Promise<DocumentDetail[]> {
  const list = await manager.agent.get(`${corpusPath()}/documents?limit=200&sort=created&dir=asc`);
  const mine = (list.body.items as DocumentListItem[]).filter((d) => d.filename === file.filename);
  const details = await Promise.all(mine.map((d) => manager.agent.get(`${corpusPath()}/documents/${d.id}`)));
  return details.map((r) => r.body as DocumentDetail).sort((a, b) => a.title.localeCompare(b.title));
}

function expectExactOffsets(doc: DocumentDetail): void {
  doc.tokens.starts.forEach((start, i) => {
    const token = doc.text.slice(start, doc.tokens.ends[i]);
    expect(token.length).toBeGreaterThan(0);
    expect(token).not.toMatch(/\s/);
  });
}

describe("upload limits", () => {
  it("reports the limits the upload enforces", async () => {
    const res = await admin.agent.get(`${corpusPath()}/uploads/limits`);
    expect(res.body).toEqual({
      maxFileBytes: 64 * 1024,
      maxFilesPerUpload: 12,
      maxUploadBytes: 512 * 1024,
      maxDocumentChars: 20000,
      extensions: [".txt", ".pdf", ".docx", ".jsonl", ".conll", ".bio"],
    });
  });
});

describe("plain text", () => {
  it("imports UTF-8 text with exact offsets and refuses invalid UTF-8, empty, oversized and unknown files by name", async () => {
    const good = "Ada Brightwater signed for Quillmark Ltd.\r\nThe meeting was in Lowmere. Café señor 霧港 🙂.";
    const invalid = Buffer.concat([Buffer.from("Valid start, then "), Buffer.from([0xc3, 0x28]), Buffer.from(" broken.")]);
    const { response, byName } = await uploadAndWait(manager.agent, admin.orgId, corpusId, [
      { name: "minutes.txt", content: good },
      { name: "broken.txt", content: invalid },
      { name: "empty.txt", content: "" },
      { name: "huge.txt", content: "word ".repeat(14_000) },
      { name: "picture.png", content: Buffer.from([0x89, 0x50, 0x4e, 0x47]) },
    ]);
    // The immediate answer already refuses what needs no parsing, file by file.
    const immediate = Object.fromEntries(response.files.map((f) => [f.filename, f]));
    expect(immediate["minutes.txt"]!.state).toMatch(/queued|processing|ready/);
    expect(immediate["broken.txt"]).toMatchObject({ state: "failed" });
    expect(immediate["broken.txt"]!.error).toMatch(/not valid UTF-8.*offset 18 \(0xC3\)/);
    expect(immediate["empty.txt"]!.error).toBe("is empty");
    expect(immediate["huge.txt"]!.error).toMatch(/is 68\.4 KB; a file may be at most 64 KB/);
    expect(immediate["picture.png"]!.error).toMatch(/ending \.png, which we do not read/);

    expect(byName["minutes.txt"]).toMatchObject({ state: "ready", documentsCreated: 1, error: null });
    const [doc] = await documentsOfFile(byName["minutes.txt"]!);
    expect(doc!.title).toBe("minutes");
    expect(doc!.text).toBe(good.replace("\r\n", "\n"));
    expectExactOffsets(doc!);
    const words = doc!.tokens.starts.map((s, i) => doc!.text.slice(s, doc!.tokens.ends[i]));
    expect(words).toContain("🙂");
    expect(words).toContain("Café");
    expect(doc!.tokens.sentenceStarts.length).toBeGreaterThanOrEqual(2);
  });

  it("refuses text over the document character limit after reading it", async () => {
    const { byName } = await uploadAndWait(manager.agent, admin.orgId, corpusId, [{ name: "long.txt", content: "abcd ".repeat(4_100) }]);
    expect(byName["long.txt"]).toMatchObject({ state: "failed", documentsCreated: 0 });
    expect(byName["long.txt"]!.error).toMatch(/20,500 characters long; a document may have at most 20,000/);
  });
});

describe("PDF", () => {
  it("imports a PDF's pages without page markers and refuses encrypted, image-only, truncated and fake PDFs", async () => {
    const pdf = makePdf([["Minutes of the Lowmere board.", "Present: Ada Brightwater."], ["Second page closes -- 1 of 3 -- here."]]);
    const { byName } = await uploadAndWait(manager.agent, admin.orgId, corpusId, [
      { name: "board.pdf", content: pdf },
      { name: "locked.pdf", content: makeEncryptedPdf() },
      { name: "scan.pdf", content: makeImageOnlyPdf() },
      { name: "cut.pdf", content: pdf.subarray(0, Math.floor(pdf.length / 2)) },
      { name: "fake.pdf", content: "just words" },
    ]);
    expect(byName["board.pdf"]).toMatchObject({ state: "ready", documentsCreated: 1 });
    const [doc] = await documentsOfFile(byName["board.pdf"]!);
    expect(doc!.text).toBe("Minutes of the Lowmere board.\nPresent: Ada Brightwater.\n\nSecond page closes -- 1 of 3 -- here.");
    expectExactOffsets(doc!);
    expect(byName["locked.pdf"]!.error).toMatch(/encrypted with a password/);
    expect(byName["scan.pdf"]!.error).toMatch(/no text layer/);
    expect(byName["cut.pdf"]!.error).toMatch(/damaged or not a PDF/);
    expect(byName["fake.pdf"]!.error).toMatch(/does not start with %PDF-/);
  });
});

describe("DOCX", () => {
  it("imports a DOCX's paragraphs and refuses a broken archive", async () => {
    const docx = makeDocx(["Agreement between Quillmark Ltd. and Ada Brightwater.", "Signed in Lowmere."]);
    const { byName } = await uploadAndWait(manager.agent, admin.orgId, corpusId, [
      { name: "agreement.docx", content: docx },
      { name: "broken.docx", content: docx.subarray(0, 120) },
      { name: "plain.docx", content: "not a zip" },
    ]);
    expect(byName["agreement.docx"]).toMatchObject({ state: "ready", documentsCreated: 1 });
    const [doc] = await documentsOfFile(byName["agreement.docx"]!);
    expect(doc!.text).toBe("Agreement between Quillmark Ltd. and Ada Brightwater.\n\nSigned in Lowmere.");
    expectExactOffsets(doc!);
    expect(byName["broken.docx"]!.error).toMatch(/damaged or not a DOCX/);
    expect(byName["plain.docx"]!.error).toMatch(/not a DOCX file/);
  });
});

describe("JSONL", () => {
  const line = (o: object) => JSON.stringify(o);

  it("imports documents with spans as gold, with titles and splits from the lines", async () => {
    const text = "Quillmark Ltd. hired Ada Brightwater in Lowmere.";
    const content = [
      line({ text, title: "Hiring", split: "train", spans: [{ start: 0, end: 14, type: "PARTY" }, { start: 21, end: 36, type: "PARTY" }, { start: 40, end: 47, type: "PLACE" }] }),
      "",
      line({ text: "No entities here at all." }),
      line({ text: "Empty but annotated.", spans: [] }),
    ].join("\n");
    const { byName } = await uploadAndWait(manager.agent, admin.orgId, corpusId, [{ name: "gold.jsonl", content }], { spanMode: "gold", defaultSplit: "test" });
    expect(byName["gold.jsonl"]).toMatchObject({ state: "ready", documentsCreated: 3 });
    const docs = await documentsOfFile(byName["gold.jsonl"]!);
    const hiring = docs.find((d) => d.title === "Hiring")!;
    expect(hiring).toMatchObject({ split: "train", annotationStatus: "gold" });
    expect(hiring.gold).toEqual([
      { start: 0, end: 14, type: "PARTY" },
      { start: 21, end: 36, type: "PARTY" },
      { start: 40, end: 47, type: "PLACE" },
    ]);
    const plain = docs.find((d) => d.title === "gold line 3")!;
    expect(plain).toMatchObject({ split: "test", annotationStatus: "none", gold: [] });
    expect(docs.find((d) => d.title === "gold line 4")).toMatchObject({ annotationStatus: "gold", gold: [] });
  });

  it("imports spans as suggestions when the uploader chooses so", async () => {
    const content = line({ text: "Ada Brightwater spoke.", spans: [{ start: 0, end: 15, type: "PARTY", confidence: 0.6 }, { start: 16, end: 21, type: "PLACE" }] });
    const { byName } = await uploadAndWait(manager.agent, admin.orgId, corpusId, [{ name: "suggested.jsonl", content }], { spanMode: "suggested" });
    const [doc] = await documentsOfFile(byName["suggested.jsonl"]!);
    expect(doc).toMatchObject({ annotationStatus: "none", gold: [] });
    expect(doc!.suggestions).toEqual([
      { start: 0, end: 15, type: "PARTY", confidence: 0.6 },
      { start: 16, end: 21, type: "PLACE", confidence: 1 },
    ]);
  });

  it("refuses a file with a bad span on line 3, naming the line, and imports nothing from it", async () => {
    const content = [
      line({ text: "Ada Brightwater arrived.", spans: [{ start: 0, end: 15, type: "PARTY" }] }),
      line({ text: "Quillmark Ltd. paid.", spans: [{ start: 0, end: 14, type: "PARTY" }] }),
      line({ text: "Lowmere is small.", spans: [{ start: 0, end: 40, type: "PLACE" }] }),
      "{not json",
      line({ text: "Two spans overlap.", spans: [{ start: 0, end: 9, type: "PARTY" }, { start: 4, end: 12, type: "PLACE" }] }),
      line({ text: "Unknown type.", spans: [{ start: 0, end: 7, type: "WEAPON" }] }),
      line({ text: "Backwards.", spans: [{ start: 5, end: 2, type: "PARTY" }] }),
      line({ title: "no text" }),
    ].join("\n");
    const { byName } = await uploadAndWait(manager.agent, admin.orgId, corpusId, [
      { name: "bad.jsonl", content },
      { name: "fine.txt", content: "One bad file never blocks the others." },
    ]);
    expect(byName["fine.txt"]).toMatchObject({ state: "ready" });
    const bad = byName["bad.jsonl"]!;
    expect(bad).toMatchObject({ state: "failed", documentsCreated: 0 });
    expect(bad.error).toMatch(/first on line 3: spans\[0\] \[0, 40\) is outside the text \(length 17\)/);
    expect(bad.error).toMatch(/Nothing from this file was imported/);
    expect(bad.problems.map((p) => p.line)).toEqual([3, 4, 5, 6, 7, 8]);
    expect(bad.problems[1]!.message).toMatch(/not valid JSON/);
    expect(bad.problems[2]!.message).toMatch(/overlap/);
    expect(bad.problems[3]!.message).toMatch(/"WEAPON", which is not in the corpus's entity schema/);
    expect(bad.problems[4]!.message).toMatch(/must end after it starts/);
    expect(bad.problems[5]!.message).toMatch(/^text: /);
    expect(await documentsOfFile(bad)).toEqual([]);
  });
});

describe("column files", () => {
  const iob2 = ["-DOCSTART- -X- -X- O", "", "Ada B-PARTY", "Brightwater I-PARTY", "visited O", "Lowmere B-PLACE", ". O", "", "She O", "left O", ". O", "", "-DOCSTART- -X- -X- O", "", "Quillmark B-PARTY", "Ltd. I-PARTY", "paid O", ""].join("\n");
  // IOB1: I- opens a chunk; B- only separates two adjacent chunks of the same type.
  const iob1 = ["Ada\tNNP\tI-PARTY", "Brightwater\tNNP\tI-PARTY", "Quillmark\tNNP\tB-PARTY", "met\tVBD\tO", "in\tIN\tO", "Lowmere\tNNP\tI-PLACE", ""].join("\n");

  it("reads IOB2 with documents and sentences, keeping the file's tokens", async () => {
    const { byName } = await uploadAndWait(manager.agent, admin.orgId, corpusId, [{ name: "news.conll", content: iob2 }]);
    expect(byName["news.conll"]).toMatchObject({ state: "ready", documentsCreated: 2 });
    const [first, second] = await documentsOfFile(byName["news.conll"]!);
    expect(first!.title).toBe("news 1");
    expect(first!.text).toBe("Ada Brightwater visited Lowmere .\nShe left .");
    expect(first!.tokens.sentenceStarts).toEqual([0, 5]);
    expect(first!.gold).toEqual([
      { start: 0, end: 15, type: "PARTY" },
      { start: 24, end: 31, type: "PLACE" },
    ]);
    expect(first!.annotationStatus).toBe("gold");
    expect(second!.text).toBe("Quillmark Ltd. paid");
    expect(second!.gold).toEqual([{ start: 0, end: 14, type: "PARTY" }]);
  });

  it("reads IOB1 the same way (conlleval chunk rules)", async () => {
    const { byName } = await uploadAndWait(manager.agent, admin.orgId, corpusId, [{ name: "old.bio", content: iob1 }]);
    const [doc] = await documentsOfFile(byName["old.bio"]!);
    expect(doc!.text).toBe("Ada Brightwater Quillmark met in Lowmere");
    expect(doc!.gold).toEqual([
      { start: 0, end: 15, type: "PARTY" },
      { start: 16, end: 25, type: "PARTY" },
      { start: 33, end: 40, type: "PLACE" },
    ]);
  });

  it("refuses a file with a bad tag or an unknown type, naming the line", async () => {
    const { byName } = await uploadAndWait(manager.agent, admin.orgId, corpusId, [
      { name: "badtag.conll", content: "Ada B-PARTY\nsang X-VERB\n" },
      { name: "unknown.conll", content: "Ada B-PARTY\n\nwith O\nswords B-WEAPON\n" },
      { name: "onecol.conll", content: "Ada\n" },
    ]);
    expect(byName["badtag.conll"]!.error).toMatch(/line 2: tag "X-VERB" is not an IOB tag/);
    expect(byName["badtag.conll"]!.problems).toEqual([{ line: 2, message: expect.stringMatching(/X-VERB/) }]);
    expect(byName["unknown.conll"]!.error).toMatch(/line 4: type WEAPON is not in the corpus's entity schema/);
    expect(byName["onecol.conll"]!.error).toMatch(/line 1: expected at least 2 columns/);
  });
});

describe("upload requests", () => {
  it("refuses more files than the limit before reading any, and an upload with no files", async () => {
    const files = Array.from({ length: 13 }, (_, i) => ({ name: `f${i}.txt`, content: "x" }));
    const tooMany = await uploadFiles(manager.agent, admin.orgId, corpusId, files);
    expect(tooMany.status).toBe(413);
    expect(tooMany.body.error.message).toMatch(/at most 12 files/);
    const none = await manager.agent.post(`${corpusPath()}/uploads`).field("spanMode", "gold");
    expect(none.status).toBe(400);
  });

  it("refuses a request larger than the upload limit", async () => {
    const files = Array.from({ length: 10 }, (_, i) => ({ name: `big${i}.txt`, content: "y".repeat(60 * 1024) }));
    const res = await uploadFiles(manager.agent, admin.orgId, corpusId, files);
    expect(res.status).toBe(413);
    expect(res.body.error.message).toMatch(/at most 512 KB/);
  });

  it("refuses bad options and uploads to an archived corpus, and lets only managers and admins upload", async () => {
    const bad = await uploadFiles(manager.agent, admin.orgId, corpusId, [{ name: "a.txt", content: "x" }], { spanMode: "sometimes" });
    expect(bad.status).toBe(400);
    const annotator = await addSignedInMember(server, admin.orgId, "annotator");
    expect((await uploadFiles(annotator.agent, admin.orgId, corpusId, [{ name: "a.txt", content: "x" }])).status).toBe(403);
    const { corpusId: archivedId } = await createCorpusWithTypes(manager.agent, admin.orgId, "Archived uploads");
    await manager.agent.patch(`/api/orgs/${admin.orgId}/corpora/${archivedId}`).send({ archived: true });
    const res = await uploadFiles(manager.agent, admin.orgId, archivedId, [{ name: "a.txt", content: "x" }]);
    expect(res.status).toBe(409);
  });

  it("lists uploads and files with per-state counts and logs each upload", async () => {
    const uploads = await manager.agent.get(`${corpusPath()}/uploads?limit=3`);
    expect(uploads.body.items).toHaveLength(3);
    expect(uploads.body.nextCursor).not.toBeNull();
    const failed = await manager.agent.get(`${corpusPath()}/files?state=failed&limit=200`);
    expect(failed.body.items.length).toBeGreaterThan(5);
    expect(failed.body.items.every((f: UploadFile) => f.state === "failed" && f.error)).toBe(true);
    expect(failed.body.counts.failed).toBe(failed.body.items.length);
    const audit = await admin.agent.get(`/api/orgs/${admin.orgId}/audit?action=upload.created&limit=200`);
    expect(audit.body.items.length).toBeGreaterThanOrEqual(8);
    expect(audit.body.items[0].details).toMatchObject({ corpusId });
  });
});
