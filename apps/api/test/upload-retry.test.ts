import type { UploadResult } from "@tagloom/contracts";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/knex";
import { processFileGroup } from "@/uploads/process-files";
import { createCorpusWithTypes, uploadFiles } from "./support/corpora";
import { type SignedIn, type TestServer, signUpFounder, startTestServer } from "./support/http";

// No workers run in this file: the test plays the extraction job itself, as pg-boss would on a
// retry, to check that a job run twice (or twice at once) never stores a document twice.
let server: TestServer;
let admin: SignedIn;
let corpusId: string;

beforeAll(async () => {
  server = await startTestServer();
  admin = await signUpFounder(server, { organizationName: "Retry Org" });
  ({ corpusId } = await createCorpusWithTypes(admin.agent, admin.orgId, "Retries", ["PARTY"]));
});

const files = [
  { name: "a.txt", content: "First file about Ada Brightwater." },
  { name: "b.jsonl", content: [JSON.stringify({ text: "Line one." }), JSON.stringify({ text: "Ada again.", spans: [{ start: 0, end: 3, type: "PARTY" }] })].join("\n") },
  { name: "c.conll", content: "Ada B-PARTY\nleft O\n\n-DOCSTART-\n\nQuillmark B-PARTY\n" },
];

async function upload(): Promise<UploadResult> {
  const res = await uploadFiles(admin.agent, admin.orgId, corpusId, files);
  expect(res.status).toBe(202);
  return res.body as UploadResult;
}

async function documentCount(uploadId: string): Promise<number> {
  const r = await db("documents as d").join("upload_files as f", "f.id", "d.upload_file_id").where("f.upload_id", uploadId).count<{ n: string }[]>({ n: "*" });
  return Number(r[0]!.n);
}

const payload = (u: UploadResult) => ({ organizationId: admin.orgId, corpusId, uploadId: u.upload.id, fileIds: u.files.map((f) => f.id) });

describe("extraction job retries", () => {
  it("a job run again after it finished changes nothing", async () => {
    const u = await upload();
    expect(u.files.every((f) => f.state === "queued")).toBe(true);
    await processFileGroup(payload(u));
    expect(await documentCount(u.upload.id)).toBe(5);
    const before = await db("upload_files").where("upload_id", u.upload.id).orderBy("file_index").select("state", "documents_created", "finished_at");
    await processFileGroup(payload(u));
    expect(await documentCount(u.upload.id)).toBe(5);
    expect(await db("upload_files").where("upload_id", u.upload.id).orderBy("file_index").select("state", "documents_created", "finished_at")).toEqual(before);
  });

  it("a job retried over documents already stored (a worker died before finishing) adds none twice", async () => {
    const u = await upload();
    const contents = await db("upload_files").where("upload_id", u.upload.id).select("id", "content");
    await processFileGroup(payload(u));
    const ids = (await db("documents as d").join("upload_files as f", "f.id", "d.upload_file_id").where("f.upload_id", u.upload.id).select("d.id")).map((r) => r.id).sort();
    // Put the files back as a worker would find them mid-way: processing, bytes still there.
    for (const c of contents) await db("upload_files").where("id", c.id).update({ state: "processing", content: c.content, documents_created: 0 });
    await processFileGroup(payload(u));
    const again = (await db("documents as d").join("upload_files as f", "f.id", "d.upload_file_id").where("f.upload_id", u.upload.id).select("d.id")).map((r) => r.id).sort();
    expect(again).toEqual(ids);
    const states = await db("upload_files").where("upload_id", u.upload.id).orderBy("file_index").select("state", "documents_created");
    expect(states).toEqual([
      { state: "ready", documents_created: 1 },
      { state: "ready", documents_created: 2 },
      { state: "ready", documents_created: 2 },
    ]);
  });

  it("two workers running the same job at once store each document once", async () => {
    const u = await upload();
    await Promise.all([processFileGroup(payload(u)), processFileGroup(payload(u))]);
    expect(await documentCount(u.upload.id)).toBe(5);
    const gold = await db("document_gold as g").join("documents as d", "d.id", "g.document_id").join("upload_files as f", "f.id", "d.upload_file_id").where("f.upload_id", u.upload.id).count<{ n: string }[]>({ n: "*" });
    expect(Number(gold[0]!.n)).toBe(3);
  });
});
