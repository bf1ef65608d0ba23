import http from "node:http";
import type { UploadResult } from "@tagloom/contracts";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/knex";
import { uploadFiles, waitForUpload } from "./support/corpora";
import type { SignedIn, TestServer } from "./support/http";
import { startManagerCorpus } from "./support/manager-corpus";
import { tenantFingerprint } from "./support/tenant-fixture";

// Why these inputs: PostgreSQL refuses U+0000 in text ("invalid byte sequence for encoding
// UTF8: 0x00", PostgreSQL 15 manual §8.3 Character Types: "the character with code zero cannot
// be stored"); timestamps must exist on the calendar (manual §8.5.1.1, "date/time field value
// out of range"); int4 holds -2^31..2^31-1 and int8 19 digits (manual §8.1.1). Each case below
// sends such a value and checks the 400, its message, and that nothing of the organization changed.

let server: TestServer;
let admin: SignedIn;
let manager: SignedIn;
let corpusId: string;
let typeId: string;

beforeAll(async () => {
  const made = await startManagerCorpus("Brindle Input Works", "Input corpus", ["PARTY"]);
  ({ server, admin, manager, corpusId } = made);
  typeId = made.typeIds.PARTY!;
});

const org = () => `/api/orgs/${admin.orgId}`;
const cursorOf = (value: unknown, id: unknown = "00000000-0000-4000-8000-000000000000") => Buffer.from(JSON.stringify([value, id])).toString("base64url");

async function expectRefusedUnchanged(send: () => Promise<{ status: number; body: { error?: { message: string; details?: unknown } } }>, message: RegExp, status = 400) {
  const before = await tenantFingerprint(admin.orgId);
  const res = await send();
  expect(res.status, JSON.stringify(res.body)).toBe(status);
  expect(res.body.error?.message).toMatch(message);
  expect(await tenantFingerprint(admin.orgId)).toEqual(before);
  return res;
}

/** Sends raw bytes as the upload body with the given Content-Type (supertest would fix the form). */
function rawSend(who: SignedIn, path: string, contentType: string | null, body: Buffer): Promise<{ status: number; body: { error?: { message: string } } }> {
  const url = new URL(`${server.url}${path}`);
  const cookie = (who.agent as unknown as { jar: { getCookies: (o: object) => Array<{ toValueString: () => string }> } }).jar
    .getCookies({ domain: url.hostname, path: "/", secure: false, script: false })
    .map((c) => c.toValueString())
    .join("; ");
  return new Promise((resolve, reject) => {
    const req = http.request(url, { method: "POST", headers: { Origin: server.url, Cookie: cookie, "Content-Length": body.length, ...(contentType ? { "Content-Type": contentType } : {}) } }, (res) => {
      const chunks: Buffer[] = [];
      res.on("data", (c: Buffer) => chunks.push(c));
      res.on("end", () => resolve({ status: res.statusCode ?? 0, body: JSON.parse(Buffer.concat(chunks).toString("utf8") || "{}") }));
    });
    req.on("error", reject);
    req.end(body);
  });
}
describe("text the database refuses", () => {
  const NUL = /NUL character \(U\+0000\)/;

  it("refuses NUL in every stored string with a 400 naming the field", async () => {
    type Sent = Promise<{ status: number; body: { error?: { message: string; details?: unknown } } }>;
    const cases: Array<[string, () => Sent]> = [
      ["corpus name", () => manager.agent.post(`${org()}/corpora`).send({ name: "Bad\u0000name" })],
      ["corpus description", () => manager.agent.patch(`${org()}/corpora/${corpusId}`).send({ description: "a\u0000b" })],
      ["organization name", () => admin.agent.patch(org()).send({ name: "Org\u0000" })],
      ["entity-type guideline", () => manager.agent.patch(`${org()}/corpora/${corpusId}/entity-types/${typeId}`).send({ guideline: "Mark \u0000 parties" })],
      ["batch name", () => manager.agent.post(`${org()}/corpora/${corpusId}/batches`).send({ name: "Week\u00001", documentIds: [], assignment: { mode: "round_robin", annotatorIds: [] } })],
    ];
    for (const [what, send] of cases) {
      const res = await expectRefusedUnchanged(send, NUL);
      expect(JSON.stringify(res.body.error!.details), what).toMatch(/NUL/);
    }
    const field = (await manager.agent.post(`${org()}/corpora`).send({ name: "ok", description: "x\u0000" })).body.error.details.fields;
    expect(Object.keys(field)).toEqual(["description"]);
  });

  it("refuses NUL in query filters (document search, audit filters)", async () => {
    await expectRefusedUnchanged(() => manager.agent.get(`${org()}/corpora/${corpusId}/documents?q=a%00b`), NUL);
    await expectRefusedUnchanged(() => admin.agent.get(`${org()}/audit?action=x%00`), NUL);
    await expectRefusedUnchanged(() => admin.agent.get(`${org()}/audit?actor=%00`), NUL);
  });

  it("refuses lone surrogates and nesting deeper than 32 levels", async () => {
    const lone = await expectRefusedUnchanged(
      () => rawSend(manager, `${org()}/corpora`, "application/json", Buffer.from('{"name":"half \\ud800 a pair"}')),
      /lone UTF-16 surrogate/,
    );
    expect(lone.body.error!.details).toEqual({ fields: { name: [expect.stringMatching(/surrogate/)] } });
    // A proper pair (an emoji) is fine.
    const ok = (await rawSend(manager, `${org()}/corpora`, "application/json", Buffer.from('{"name":"Pair \\ud83d\\ude42 corpus"}'))) as { status: number; body: { name?: string } };
    expect(ok.status).toBe(201);
    expect(ok.body.name).toBe("Pair 🙂 corpus");
    const deep = `{"name":"deep","description":${"[".repeat(5000)}"x"${"]".repeat(5000)}}`;
    await expectRefusedUnchanged(() => rawSend(manager, `${org()}/corpora`, "application/json", Buffer.from(deep)), /Nesting deeper than 32/);
  });

  it("refuses a JSON body that is not valid UTF-8", async () => {
    const body = Buffer.concat([Buffer.from('{"name":"Caf'), Buffer.from([0xe9]), Buffer.from(' corpus"}')]); // Latin-1 é
    const res = await expectRefusedUnchanged(() => rawSend(manager, `${org()}/corpora`, "application/json", body), /not valid UTF-8/);
    expect(res.body.error).toMatchObject({ code: "validation_failed" });
  });

  it("tells a foreign Origin that it is not allowed", async () => {
    const res = await expectRefusedUnchanged(
      () => manager.agent.post(`${org()}/corpora`).set("Origin", "http://elsewhere.example").send({ name: "From elsewhere" }),
      /origin "http:\/\/elsewhere\.example" are not allowed/,
      403,
    );
    expect(res.body.error!.message).not.toMatch(/no Origin/);
    // An Origin that is not even a URL (a sandboxed page sends "null") is not "missing" either.
    await expectRefusedUnchanged(() => manager.agent.post(`${org()}/corpora`).set("Origin", "null").send({ name: "Sandboxed" }), /origin "null" are not allowed/, 403);
  });
});

describe("impossible page cursors", () => {
  const lists = () => [
    { path: `${org()}/corpora/${corpusId}/documents`, kinds: ["timestamp"] },
    { path: `${org()}/corpora/${corpusId}/documents?sort=tokens`, kinds: ["integer"] },
    { path: `${org()}/corpora/${corpusId}/documents?sort=title`, kinds: ["text"] },
    { path: `${org()}/corpora/${corpusId}/uploads`, kinds: ["timestamp"] },
    { path: `${org()}/corpora/${corpusId}/files`, kinds: ["timestamp"] },
    { path: `${org()}/corpora`, kinds: ["timestamp"] },
    { path: `${org()}/members`, kinds: ["text"] },
    { path: `${org()}/batches`, kinds: ["timestamp"] },
  ];
  const bad: Record<string, unknown[]> = {
    timestamp: ["2026-13-01 10:00:00+00", "2026-12-01 25:00:00+00", "2026-02-30 10:00:00+00", "2026-12-01 10:61:00+00", "0000-01-01 00:00:00+00", "2026-12-01 10:00:00+99"],
    integer: [2 ** 31, 1e20, -(2 ** 31) - 5, 1.2345678901234567e19],
    text: ["a\u0000b", "\ud800"],
  };

  it("answers 400 for values that pass the format check but cannot exist", async () => {
    for (const { path, kinds } of lists()) {
      for (const kind of kinds) {
        for (const value of bad[kind]!) {
          const sep = path.includes("?") ? "&" : "?";
          const res = await manager.agent.get(`${path}${sep}cursor=${cursorOf(value)}`);
          expect(res.status, `${path} ${JSON.stringify(value)}: ${JSON.stringify(res.body)}`).toBe(400);
          expect(res.body.error.message).toBe("The cursor is not valid.");
        }
      }
    }
    // A cursor id with NUL, and a member cursor with a NUL user id.
    expect((await manager.agent.get(`${org()}/corpora?cursor=${cursorOf("2026-12-01 10:00:00+00", "a\u0000")}`)).status).toBe(400);
    expect((await manager.agent.get(`${org()}/members?cursor=${cursorOf("Ann", "id\u0000")}`)).status).toBe(400);
  });

  it("refuses audit cursors of 19+ digits and impossible audit dates", async () => {
    for (const q of ["cursor=12345678901234567890", "cursor=9999999999999999999", "from=2026-02-30T00:00:00Z", "to=0000-01-01T00:00:00Z", "from=2026-13-01T00:00:00Z"]) {
      const res = await admin.agent.get(`${org()}/audit?${q}`);
      expect(res.status, q).toBe(400);
      expect(res.body.error.message).toBe("The query is not valid.");
    }
    expect((await admin.agent.get(`${org()}/audit?cursor=922337203685477580`)).status).toBe(200);
  });

  it("still pages with real cursors", async () => {
    const first = await manager.agent.get(`${org()}/corpora?limit=1`);
    expect(first.status).toBe(200);
    expect(first.body.nextCursor).toBeTruthy();
    const second = await manager.agent.get(`${org()}/corpora?limit=1&cursor=${first.body.nextCursor}`);
    expect(second.status).toBe(200);
    expect(second.body.items[0].id).not.toBe(first.body.items[0].id);
  });
});

describe("uploads", () => {
  const rawUpload = (contentType: string | null, body: Buffer) => rawSend(manager, `${org()}/corpora/${corpusId}/uploads`, contentType, body);
  const part = (b: string, name: string, content: string) =>
    `--${b}\r\nContent-Disposition: form-data; name="files"; filename="${name}"\r\nContent-Type: text/plain\r\n\r\n${content}\r\n`;

  it("answers 400 to a truncated form, a missing boundary and a bad part header, and stores nothing", async () => {
    const b = "----tagloomBoundary42";
    const whole = `${part(b, "a.txt", "Some text here.")}--${b}--\r\n`;
    await expectRefusedUnchanged(() => rawUpload(`multipart/form-data; boundary=${b}`, Buffer.from(whole.slice(0, whole.length - 30))), /upload form is malformed/);
    await expectRefusedUnchanged(() => rawUpload("multipart/form-data", Buffer.from(whole)), /upload form is malformed/);
    const badHeader = `--${b}\r\nContent-Disposition form-data name files\r\n\u0001\u0002: ?\r\n\r\nxx\r\n--${b}--\r\n`;
    await expectRefusedUnchanged(() => rawUpload(`multipart/form-data; boundary=${b}`, Buffer.from(badHeader)), /upload form is malformed|Choose at least one file/);
  });

  it("refuses only the file whose encoded name holds NUL; the file beside it is imported", async () => {
    const b = "----tagloomBoundary43";
    const body =
      `${part(b, "good.txt", "A good file from Mossbank Printers.")}` +
      `--${b}\r\nContent-Disposition: form-data; name="files"; filename="x.txt"; filename*=utf-8''bad%00name.txt\r\nContent-Type: text/plain\r\n\r\nBad name text.\r\n` +
      `--${b}--\r\n`;
    const res = (await rawUpload(`multipart/form-data; boundary=${b}`, Buffer.from(body))) as unknown as { status: number; body: UploadResult };
    expect(res.status, JSON.stringify(res.body)).toBe(202);
    const result = await waitForUpload(manager.agent, admin.orgId, corpusId, res.body.upload.id);
    const good = result.files.find((f) => f.filename === "good.txt");
    const bad = result.files.find((f) => f.filename !== "good.txt");
    expect(bad).toMatchObject({ filename: "bad\uFFFDname.txt", state: "failed", documentsCreated: 0 });
    expect(bad!.error).toMatch(/has a name the service cannot keep \(it may not contain the NUL character/);
    expect(good).toMatchObject({ filename: "good.txt", state: "ready", documentsCreated: 1 });
  });

  it("lists a JSONL title with NUL as a problem on its line, and imports nothing from the file", async () => {
    const docsBefore = await db("documents").where({ corpus_id: corpusId }).count<{ count: string }[]>("* as count");
    const lines = [JSON.stringify({ text: "First line text." }), JSON.stringify({ text: "Second line text.", title: "Bad\u0000title" })].join("\n");
    const res = await uploadFiles(manager.agent, admin.orgId, corpusId, [{ name: "titles.jsonl", content: lines }]);
    expect(res.status).toBe(202);
    const result = await waitForUpload(manager.agent, admin.orgId, corpusId, res.body.upload.id);
    const file = result.files[0]!;
    expect(file.state).toBe("failed");
    expect(file.problems).toEqual([{ line: 2, message: "title: Text may not contain the NUL character (U+0000)." }]);
    expect(file.error).toMatch(/first on line 2: title: Text may not contain the NUL/);
    const docsAfter = await db("documents").where({ corpus_id: corpusId }).count<{ count: string }[]>("* as count");
    expect(docsAfter).toEqual(docsBefore);
  });
});
