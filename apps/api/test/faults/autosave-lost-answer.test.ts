import type { AnnotatedSpan, Span } from "@tagloom/contracts";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/knex";
import { type AnswerDroppingProxy, startAnswerDroppingProxy } from "../support/answer-dropping-proxy";
import { createAnnotationData, find } from "../support/annotation-data";
import { type SignedIn, type TestServer, TEST_PASSWORD, addSignedInMember, signUpFounder, startTestServer } from "../support/http";

// An autosave the API stored but whose answer the browser never read: the connection drops
// after the commit, between the API and the browser. The proxy in front of the API lets the
// PUT through, passes the answer's headers and then cuts the browser's socket.
//
// The web client's rule (apps/web/src/features/workspace/lib/autosaver.ts and lib/api-client.ts):
// a request that throws (no answer, or an answer whose body cannot be read) is a network fault
// and is sent again after a backoff, naming the same version it named before (the version only
// moves on a 200) and carrying the working copy as it is by then. A 409 stale_version makes it
// take the server's version and copy, re-apply its unsaved changes and send them at once.

const text = "Pell Orrin rode from Quistmoor to Dallow Reach with Senna Brack.";
let server: TestServer;
let proxy: AnswerDroppingProxy;
let admin: SignedIn;
let annotator: SignedIn;
let cookie: string;
let orgId: string;
let corpusId: string;
let documentIds: string[];
let typeIds: Map<string, string>;

const PERSON_1: AnnotatedSpan = { ...find(text, "Pell Orrin"), type: "PERSON", origin: "human" };
const PLACE_1: AnnotatedSpan = { ...find(text, "Quistmoor"), type: "PLACE", origin: "human" };
const PLACE_2: AnnotatedSpan = { ...find(text, "Dallow Reach"), type: "PLACE", origin: "human" };
const PERSON_2: AnnotatedSpan = { ...find(text, "Senna Brack"), type: "PERSON", origin: "human" };

beforeAll(async () => {
  server = await startTestServer();
  proxy = await startAnswerDroppingProxy(server.url);
  admin = await signUpFounder(server, { organizationName: "Quistmoor Ledger Office" });
  orgId = admin.orgId;
  annotator = await addSignedInMember(server, orgId, "annotator", "Wren Tallis");
  const data = await createAnnotationData(orgId, { userId: admin.userId, email: admin.email }, {
    types: [{ name: "PERSON" }, { name: "PLACE" }],
    documents: Array.from({ length: 4 }, (_, i) => ({ title: `Route sheet ${i + 1}`, text })),
  });
  corpusId = data.corpusId;
  documentIds = data.documentIds;
  typeIds = new Map(Object.entries(data.types).map(([name, t]) => [name, t.id]));
  // The browser's session, sent by hand through the proxy.
  const res = await fetch(`${server.url}/api/auth/sign-in`, {
    method: "POST",
    headers: { "Content-Type": "application/json", Origin: server.url },
    body: JSON.stringify({ email: annotator.email, password: TEST_PASSWORD }),
  });
  expect(res.status).toBe(200);
  cookie = res.headers.getSetCookie().find((c) => c.startsWith("tagloom_session="))!.split(";")[0]!;
}, 60_000);

let nextDocument = 0;
/** A fresh assignment of the annotator's (one document each), at its first version. */
async function freshAssignment(): Promise<{ id: string; version: number }> {
  const documentId = documentIds[nextDocument++]!;
  const batch = await admin.agent
    .post(`/api/orgs/${orgId}/corpora/${corpusId}/batches`)
    .send({ name: `Lost answers ${nextDocument}`, documentIds: [documentId], assignment: { mode: "round_robin", annotatorIds: [annotator.userId], annotatorsPerDocument: 1 } });
  expect(batch.status, JSON.stringify(batch.body)).toBe(201);
  const row = await db("assignments").where({ organization_id: orgId, batch_id: batch.body.id }).first("id", "version");
  return { id: row.id, version: row.version };
}

type Sent = { status: number; body: { version?: number; state?: string; error?: { code: string; details: { version: number; spans: Span[] } } } } | { thrown: string };

/** One PUT through the proxy, read as the web client reads it (fetch, then the body). */
async function put(assignmentId: string, version: number, spans: AnnotatedSpan[], dismissedSuggestions: Span[] = []): Promise<Sent> {
  try {
    const res = await fetch(`${proxy.url}/api/orgs/${orgId}/corpora/${corpusId}/assignments/${assignmentId}`, {
      method: "PUT",
      headers: { "Content-Type": "application/json", Cookie: cookie, Origin: proxy.url },
      body: JSON.stringify({ version, spans, dismissedSuggestions }),
    });
    return { status: res.status, body: JSON.parse(await res.text()) };
  } catch (err) {
    return { thrown: String(err) };
  }
}

async function stored(assignmentId: string) {
  const row = await db("assignments").where({ organization_id: orgId, id: assignmentId }).first("version", "state", "spans", "dismissed_suggestions");
  return { version: row.version as number, state: row.state as string, spans: row.spans as Array<{ start: number; end: number; typeId: string }>, dismissed: row.dismissed_suggestions as unknown[] };
}

/** Spans as the row holds them: sorted by offset, the type by id, a human origin left out. */
const storedForm = (spans: AnnotatedSpan[]) =>
  [...spans].sort((x, y) => x.start - y.start || x.end - y.end).map((s) => ({ start: s.start, end: s.end, typeId: typeIds.get(s.type)! }));

/** The first save of `spans` from `version`, whose answer is lost after the server stored it. */
async function saveAndLoseTheAnswer(assignmentId: string, version: number, spans: AnnotatedSpan[]): Promise<void> {
  const dropsBefore = proxy.dropped();
  proxy.dropNextAnswer();
  const first = await put(assignmentId, version, spans);
  expect(first).toHaveProperty("thrown");
  expect(proxy.dropped()).toBe(dropsBefore + 1);
  // The server did store it: one version further, with the spans sent.
  const after = await stored(assignmentId);
  expect(after.version).toBe(version + 1);
  expect(after.spans).toEqual(storedForm(spans));
}

describe("an autosave whose answer is lost after the server stored it", () => {
  it("the retry with the same version and the same spans answers 200 with the stored version, bumping nothing", async () => {
    const a = await freshAssignment();
    const spans = [PERSON_1, PLACE_1];
    await saveAndLoseTheAnswer(a.id, a.version, spans);

    const retry = await put(a.id, a.version, spans);
    expect(retry).toEqual({ status: 200, body: expect.objectContaining({ version: a.version + 1, state: "in_progress" }) });
    expect(await stored(a.id)).toMatchObject({ version: a.version + 1, spans: storedForm(spans) });

    // A second retry of the same save (its answer lost too) answers the same.
    const again = await put(a.id, a.version, spans);
    expect(again).toEqual({ status: 200, body: expect.objectContaining({ version: a.version + 1 }) });

    // The client carries on from the version it was given: the next save is an ordinary one.
    const next = await put(a.id, a.version + 1, [...spans, PLACE_2]);
    expect(next).toEqual({ status: 200, body: expect.objectContaining({ version: a.version + 2 }) });
    expect(await stored(a.id)).toMatchObject({ version: a.version + 2, spans: storedForm([PERSON_1, PLACE_1, PLACE_2]) });
  });

  it("edits made before the retry are not lost: the retry is stale, the client re-applies them onto the stored copy once", async () => {
    const a = await freshAssignment();
    await saveAndLoseTheAnswer(a.id, a.version, [PERSON_1]);

    // Meanwhile the annotator marked another span; the retry carries it, still naming the old version.
    const working = [PERSON_1, PLACE_1];
    const retry = await put(a.id, a.version, working);
    expect(retry).toMatchObject({ status: 409, body: { error: { code: "stale_version", details: { version: a.version + 1 } } } });
    // What the server holds is the lost save itself, so re-applying the working copy onto it
    // conflicts with nothing: the client sends it at once with the server's version.
    const details = (retry as { body: { error: { details: { version: number; spans: Span[] } } } }).body.error.details;
    expect(details.spans).toEqual([{ start: PERSON_1.start, end: PERSON_1.end, type: "PERSON", origin: "human" }]);
    const resend = await put(a.id, details.version, working);
    expect(resend).toEqual({ status: 200, body: expect.objectContaining({ version: a.version + 2 }) });
    expect(await stored(a.id)).toMatchObject({ version: a.version + 2, spans: storedForm(working) });
  });

  it("a stale save with other spans still answers 409, and one of a submitted assignment is still refused", async () => {
    const a = await freshAssignment();
    await saveAndLoseTheAnswer(a.id, a.version, [PERSON_1, PERSON_2]);

    // Another tab of the same annotator, still at the first version, with different spans.
    const otherTab = await put(a.id, a.version, [PLACE_1]);
    expect(otherTab).toMatchObject({ status: 409, body: { error: { code: "stale_version" } } });
    // Same spans but two versions behind is not a retry of the last save: stale.
    const later = await put(a.id, a.version + 1, [PERSON_1, PERSON_2, PLACE_2]);
    expect(later).toEqual({ status: 200, body: expect.objectContaining({ version: a.version + 2 }) });
    const twoBehind = await put(a.id, a.version, [PERSON_1, PERSON_2, PLACE_2]);
    expect(twoBehind).toMatchObject({ status: 409, body: { error: { code: "stale_version", details: { version: a.version + 2 } } } });
    expect(await stored(a.id)).toMatchObject({ version: a.version + 2, spans: storedForm([PERSON_1, PERSON_2, PLACE_2]) });

    // Submitted from the current version: a late retry of the last save is refused as locked.
    const submit = await annotator.agent.post(`/api/orgs/${orgId}/corpora/${corpusId}/assignments/${a.id}/submit`).send({ version: a.version + 2 });
    expect(submit.status, JSON.stringify(submit.body)).toBe(200);
    const lateRetry = await put(a.id, a.version + 1, [PERSON_1, PERSON_2, PLACE_2]);
    expect(lateRetry).toMatchObject({ status: 409, body: { error: { code: "assignment_locked" } } });
    expect(await stored(a.id)).toMatchObject({ version: a.version + 3, state: "submitted" });
  });

  it("the retry's spans are compared with what is stored, origin and dismissed suggestions included", async () => {
    const a = await freshAssignment();
    await saveAndLoseTheAnswer(a.id, a.version, [PERSON_1, PLACE_1]);
    // The same places but one marked as an accepted suggestion: not the same save.
    const originDiffers = await put(a.id, a.version, [PERSON_1, { ...PLACE_1, origin: "suggested" }]);
    expect(originDiffers).toMatchObject({ status: 409, body: { error: { code: "stale_version" } } });
    const dismissedDiffers = await put(a.id, a.version, [PERSON_1, PLACE_1], [{ start: PLACE_2.start, end: PLACE_2.end, type: "PLACE" }]);
    expect(dismissedDiffers).toMatchObject({ status: 409, body: { error: { code: "stale_version" } } });
    // The spans in another order are the same save (they are stored sorted by offset).
    const reordered = await put(a.id, a.version, [PLACE_1, PERSON_1]);
    expect(reordered).toEqual({ status: 200, body: expect.objectContaining({ version: a.version + 1 }) });
    expect((await stored(a.id)).version).toBe(a.version + 1);
  });
});
