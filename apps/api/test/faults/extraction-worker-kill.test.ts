import type { UploadResult } from "@tagloom/contracts";
import { beforeAll, describe, expect, it } from "vitest";
import { env } from "@/config/env";
import { db } from "@/db/knex";
import { createCorpusWithTypes, uploadFiles } from "../support/corpora";
import { makePdf } from "../support/files/pdf";
import { type SignedIn, type TestServer, signUpFounder, startTestServer } from "../support/http";
import { stopProcess } from "../support/server-process";
import { startWorkerProcess } from "../support/workers";

// Workers are separate processes (src/worker.ts), as in production. The first is killed with
// SIGKILL while it is reading the files of two uploads; pg-boss hands both jobs to a second
// worker once they expire, and each file must end with its documents stored exactly once.
const EXPIRE_SECONDS = 10;
let server: TestServer;
let admin: SignedIn;
let corpusId: string;

beforeAll(async () => {
  server = await startTestServer();
  admin = await signUpFounder(server, { organizationName: "Killed Reader Office" });
  ({ corpusId } = await createCorpusWithTypes(admin.agent, admin.orgId, "Kill mid-read", ["PARTY"]));
  // Jobs this process sends expire quickly, so a dead worker's job is retried within the test.
  env.EXTRACT_JOB_EXPIRE_SECONDS = EXPIRE_SECONDS;
});

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
const WORDS = ["brell", "quon", "tavish", "morrow", "pellin", "ostrel", "viska", "dunmore", "halvey", "sorrel"];

// PDFs of a few dozen pages take pdf.js a second or more each, which leaves time to kill the
// worker between claiming the files and storing their documents.
function sheetPdf(seed: number): Buffer {
  const pages = Array.from({ length: 30 }, (_, p) => Array.from({ length: 36 }, (_, l) => `Sheet ${seed}-${p} row ${l} ${WORDS[(seed + p + l) % 10]} ${WORDS[(p * l) % 10]} quay`));
  return makePdf(pages);
}

async function uploadBundle(n: number): Promise<UploadResult> {
  const res = await uploadFiles(admin.agent, admin.orgId, corpusId, [
    { name: `ledger-${n}-a.pdf`, content: sheetPdf(10 * n + 1) },
    { name: `ledger-${n}-b.pdf`, content: sheetPdf(10 * n + 2) },
    { name: `notes-${n}.txt`, content: `Notes ${n}: ${WORDS.join(" ")}.` },
  ]);
  expect(res.status, JSON.stringify(res.body)).toBe(202);
  return res.body as UploadResult;
}

async function fileStates(uploadIds: string[]) {
  return (await db("upload_files").whereIn("upload_id", uploadIds).orderBy(["upload_id", "file_index"]).select("id", "upload_id", "state", "error", "documents_created")) as Array<{
    id: string;
    upload_id: string;
    state: string;
    error: string | null;
    documents_created: number | null;
  }>;
}

const extractJobs = (uploadIds: string[]) =>
  db.raw("SELECT id, state, retry_count FROM pgboss.job WHERE name = 'uploads.extract' AND data->>'uploadId' = ANY(?::text[]) ORDER BY created_on", [uploadIds]).then(
    (r: { rows: Array<{ id: string; state: string; retry_count: number }> }) => r.rows,
  );

describe("an extraction worker killed mid-job", () => {
  it("another worker takes the expired jobs over and each file yields exactly one document", async () => {
    const uploads = [await uploadBundle(1), await uploadBundle(2)];
    const ids = uploads.map((u) => u.upload.id);
    const fileIds = uploads.flatMap((u) => u.files.map((f) => f.id));
    expect((await fileStates(ids)).map((f) => f.state)).toEqual(Array(6).fill("queued"));

    const first = startWorkerProcess();
    // Kill it once both jobs are running and have claimed their files, before any is stored.
    const until = Date.now() + 60_000;
    for (;;) {
      const jobs = await extractJobs(ids);
      const states = (await fileStates(ids)).map((f) => f.state);
      if (jobs.length === 2 && jobs.every((j) => j.state === "active") && states.every((s) => s === "processing")) break;
      if (states.some((s) => s === "ready" || s === "failed")) throw new Error(`a file finished before the worker could be killed: ${states.join(", ")}`);
      if (Date.now() > until) throw new Error(`the jobs did not start: ${JSON.stringify(jobs)} ${states.join(", ")}`);
      await sleep(20);
    }
    first.kill("SIGKILL");
    await new Promise((r) => first.once("exit", r));
    const afterKill = await fileStates(ids);
    expect(afterKill.map((f) => f.state)).toEqual(Array(6).fill("processing"));
    expect(await db("documents").whereIn("upload_file_id", fileIds).count<{ n: number }[]>({ n: "*" })).toEqual([{ n: 0 }]);

    const second = startWorkerProcess();
    const done = Date.now() + 120_000;
    let files = afterKill;
    while (files.some((f) => f.state === "queued" || f.state === "processing")) {
      if (Date.now() > done) throw new Error(`files still unfinished: ${JSON.stringify(files)}`);
      await sleep(200);
      files = await fileStates(ids);
    }
    expect(files.map((f) => ({ state: f.state, error: f.error, documents: f.documents_created }))).toEqual(Array(6).fill({ state: "ready", error: null, documents: 1 }));

    const docs = (await db("documents").whereIn("upload_file_id", fileIds).select("upload_file_id", "source_index", "text")) as Array<{ upload_file_id: string; source_index: number; text: string }>;
    expect(docs.map((d) => d.upload_file_id).sort()).toEqual([...fileIds].sort());
    expect(docs.every((d) => d.source_index === 0)).toBe(true);
    // The text is the whole file's, not a half-read one: the last page's last row is there.
    for (const [n, bundle] of [1, 2].entries()) {
      const pdfIds = uploads[n]!.files.filter((f) => f.filename.endsWith(".pdf")).map((f) => f.id);
      for (const id of pdfIds) expect(docs.find((d) => d.upload_file_id === id)!.text).toMatch(new RegExp(`Sheet ${10 * bundle + 1 + pdfIds.indexOf(id)}-29 row 35 `));
    }
    expect(await db("document_tokens as t").join("documents as d", "d.id", "t.document_id").whereIn("d.upload_file_id", fileIds).count<{ n: number }[]>({ n: "*" })).toEqual([{ n: 6 }]);

    // Both jobs were taken over after the kill and finished there.
    const jobs = await extractJobs(ids);
    expect(jobs.map((j) => j.state)).toEqual(["completed", "completed"]);
    expect(jobs.every((j) => j.retry_count >= 1)).toBe(true);
    await stopProcess(second);
  }, 200_000);
});
