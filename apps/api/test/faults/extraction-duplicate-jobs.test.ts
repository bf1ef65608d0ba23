import type { UploadResult } from "@tagloom/contracts";
import { beforeAll, describe, expect, it, vi } from "vitest";
import { db } from "@/db/knex";
import { processFileGroup } from "@/uploads/process-files";
import { createCorpusWithTypes, uploadFiles } from "../support/corpora";
import { type SignedIn, type TestServer, signUpFounder, startTestServer } from "../support/http";

// Two runs of one extraction job at once (pg-boss hands an expired job to a second worker while
// the first is still alive, or a job is sent twice). The gate holds one run right after it has
// claimed its files, so the other can store them first: the interleaving that used to mark the
// files refused ("has no stored content") over the documents the other run had stored.
const gate = vi.hoisted(() => ({ hold: null as Promise<void> | null, onHeld: null as (() => void) | null }));
vi.mock("@/uploads/uploads.repository", async (importOriginal) => {
  const real = await importOriginal<typeof import("@/uploads/uploads.repository")>();
  return {
    ...real,
    claimFiles: async (...args: Parameters<typeof real.claimFiles>) => {
      const claimed = await real.claimFiles(...args);
      const hold = gate.hold;
      if (hold) {
        gate.hold = null;
        gate.onHeld?.();
        await hold;
      }
      return claimed;
    },
  };
});

let server: TestServer;
let admin: SignedIn;
let corpusId: string;

beforeAll(async () => {
  server = await startTestServer();
  admin = await signUpFounder(server, { organizationName: "Twin Runs Office" });
  ({ corpusId } = await createCorpusWithTypes(admin.agent, admin.orgId, "Twin runs", ["PARTY"]));
});

// 1 + 2 + 2 documents, 3 of them with gold spans.
const files = [
  { name: "a.txt", content: "First file about Ada Brightwater." },
  { name: "b.jsonl", content: [JSON.stringify({ text: "Line one." }), JSON.stringify({ text: "Ada again.", spans: [{ start: 0, end: 3, type: "PARTY" }] })].join("\n") },
  { name: "c.conll", content: "Ada B-PARTY\nleft O\n\n-DOCSTART-\n\nQuillmark B-PARTY\n" },
];
const expectedFiles = [
  { filename: "a.txt", state: "ready", error: null, documents_created: 1 },
  { filename: "b.jsonl", state: "ready", error: null, documents_created: 2 },
  { filename: "c.conll", state: "ready", error: null, documents_created: 2 },
];

async function upload(): Promise<UploadResult> {
  const res = await uploadFiles(admin.agent, admin.orgId, corpusId, files);
  expect(res.status).toBe(202);
  return res.body as UploadResult;
}

const payload = (u: UploadResult) => ({ organizationId: admin.orgId, corpusId, uploadId: u.upload.id, fileIds: u.files.map((f) => f.id) });

async function outcome(uploadId: string) {
  const fileRows = await db("upload_files").where("upload_id", uploadId).orderBy("file_index").select("filename", "state", "error", "documents_created");
  const docs = await db("documents as d")
    .join("upload_files as f", "f.id", "d.upload_file_id")
    .where("f.upload_id", uploadId)
    .select("d.upload_file_id", "d.source_index");
  const gold = await db("document_gold as g")
    .join("documents as d", "d.id", "g.document_id")
    .join("upload_files as f", "f.id", "d.upload_file_id")
    .where("f.upload_id", uploadId)
    .count<{ n: number }[]>({ n: "*" });
  const tokens = await db("document_tokens as t")
    .join("documents as d", "d.id", "t.document_id")
    .join("upload_files as f", "f.id", "d.upload_file_id")
    .where("f.upload_id", uploadId)
    .count<{ n: number }[]>({ n: "*" });
  const distinct = new Set(docs.map((d: { upload_file_id: string; source_index: number }) => `${d.upload_file_id}:${d.source_index}`));
  return { files: fileRows, documents: docs.length, distinctDocuments: distinct.size, gold: Number(gold[0]!.n), tokenRows: Number(tokens[0]!.n) };
}

describe("two extraction runs on the same files", () => {
  it("a run that claimed the files just before the other stored them leaves them ready, with each document once", async () => {
    const u = await upload();
    let release!: () => void;
    const held = new Promise<void>((resolve) => {
      gate.onHeld = resolve;
    });
    gate.hold = new Promise<void>((resolve) => {
      release = resolve;
    });
    const late = processFileGroup(payload(u));
    await held;
    // The late run has claimed the files (they are `processing`); the other now does all the work.
    expect((await db("upload_files").where("upload_id", u.upload.id).pluck("state")).every((s: string) => s === "processing")).toBe(true);
    await processFileGroup(payload(u));
    expect(await outcome(u.upload.id)).toEqual({ files: expectedFiles, documents: 5, distinctDocuments: 5, gold: 3, tokenRows: 5 });
    release();
    await late;
    expect(await outcome(u.upload.id)).toEqual({ files: expectedFiles, documents: 5, distinctDocuments: 5, gold: 3, tokenRows: 5 });
  });

  // 20 rounds: when the claim locked the files in scan order, 30 rounds deadlocked in 1 of 2 runs.
  it("runs started together, several times over, never refuse a file nor store a document twice", async () => {
    for (let round = 0; round < 20; round++) {
      const u = await upload();
      await Promise.all([processFileGroup(payload(u)), processFileGroup(payload(u)), processFileGroup(payload(u))]);
      expect(await outcome(u.upload.id), `round ${round}`).toEqual({ files: expectedFiles, documents: 5, distinctDocuments: 5, gold: 3, tokenRows: 5 });
    }
  });
});
