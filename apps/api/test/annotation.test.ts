import { beforeAll, describe, expect, it } from "vitest";
import { deleteEntityType } from "@/corpora/entity-types.service";
import { getDocumentSummaries, getGoldSpans } from "@/documents/documents.service";
import { type AnnotationData, createAnnotationData, find } from "./support/annotation-data";
import { type SignedIn, type TestServer, addSignedInMember, signUpFounder, startTestServer } from "./support/http";
import { testMail, waitForMail } from "./support/mail";
import { startTestWorkers } from "./support/workers";

let server: TestServer;
let manager: SignedIn;
let ann1: SignedIn;
let ann2: SignedIn;
let dataLead: SignedIn;
let data: AnnotationData;
let org: string;

const textA = "Mira Quell met Tobin Vale at the Saltmarsh depot. They signed the lease for Fernbrook Mills.";
const textB = "Orla Finch inspected the Gullhaven pier on Tuesday.";
const textC = "Nobody from Ostrandel Freight answered the letter.";

const base = () => `/api/orgs/${org}/corpora/${data.corpusId}`;

beforeAll(async () => {
  server = await startTestServer();
  await startTestWorkers();
  const admin = await signUpFounder(server, { organizationName: "Saltmarsh Cooperative" });
  org = admin.orgId;
  [manager, ann1, ann2, dataLead] = await Promise.all([
    addSignedInMember(server, org, "manager", "Hale Manager"),
    addSignedInMember(server, org, "annotator", "Ines Annotator"),
    addSignedInMember(server, org, "annotator", "Jory Annotator"),
    addSignedInMember(server, org, "data_lead", "Kit Lead"),
  ]);
  data = await createAnnotationData(org, { userId: admin.userId, email: admin.email }, {
    types: [
      { name: "PERSON", hotkey: "p" },
      { name: "PLACE", hotkey: "l" },
      { name: "ORG", hotkey: "o" },
    ],
    documents: [
      { title: "Depot meeting", text: textA, suggestions: [{ ...find(textA, "Mira Quell"), type: "PERSON", confidence: 0.92 }, { ...find(textA, "Saltmarsh"), type: "PLACE", confidence: 0.41 }] },
      { title: "Pier inspection", text: textB },
      { title: "Unanswered letter", text: textC },
    ],
  });
}, 60_000);

type Assignment = { id: string; annotatorId: string; state: string };
type DocumentRow = { documentId: string; assignments: Assignment[] };

async function createBatch(body: object): Promise<{ id: string; documents: DocumentRow[] }> {
  const res = await manager.agent.post(`${base()}/batches`).send(body);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  const detail = await manager.agent.get(`${base()}/batches/${res.body.id}`);
  expect(detail.status).toBe(200);
  return detail.body;
}

function assignmentOf(batch: { documents: DocumentRow[] }, documentId: string, userId: string): string {
  const a = batch.documents.find((d) => d.documentId === documentId)!.assignments.find((x) => x.annotatorId === userId);
  if (!a) throw new Error("no such assignment");
  return a.id;
}

describe("batches", () => {
  it("refuses bad batches with field errors and changes nothing", async () => {
    const before = await manager.agent.get(`${base()}/batches`);
    const cases: Array<[object, RegExp]> = [
      [{ name: "", documentIds: data.documentIds, assignment: { mode: "round_robin", annotatorIds: [ann1.userId], annotatorsPerDocument: 1 } }, /name/],
      [{ name: "X", documentIds: [], assignment: { mode: "round_robin", annotatorIds: [ann1.userId], annotatorsPerDocument: 1 } }, /documentIds/],
      [{ name: "X", documentIds: data.documentIds, assignment: { mode: "round_robin", annotatorIds: [ann1.userId], annotatorsPerDocument: 2 } }, /annotatorsPerDocument/],
      [{ name: "X", documentIds: data.documentIds, assignment: { mode: "round_robin", annotatorIds: ["not-a-member"], annotatorsPerDocument: 1 } }, /annotatorIds/],
      [{ name: "X", documentIds: ["00000000-0000-4000-8000-000000000000"], assignment: { mode: "round_robin", annotatorIds: [ann1.userId], annotatorsPerDocument: 1 } }, /documentIds/],
      [{ name: "X", dueDate: "2001-01-01", documentIds: data.documentIds, assignment: { mode: "round_robin", annotatorIds: [ann1.userId], annotatorsPerDocument: 1 } }, /dueDate/],
      [{ name: "X", dueDate: "2031-02-30", documentIds: data.documentIds, assignment: { mode: "round_robin", annotatorIds: [ann1.userId], annotatorsPerDocument: 1 } }, /dueDate/],
      [{ name: "X", documentIds: data.documentIds, assignment: { mode: "by_hand", documents: [{ documentId: data.documentIds[0], annotatorIds: [ann1.userId] }] } }, /assignment\.documents/],
    ];
    for (const [body, field] of cases) {
      const res = await manager.agent.post(`${base()}/batches`).send(body);
      expect(res.status, JSON.stringify(res.body)).toBe(400);
      expect(Object.keys(res.body.error.details.fields).join(" ")).toMatch(field);
    }
    expect((await manager.agent.get(`${base()}/batches`)).body.items).toEqual(before.body.items);
  });

  it("only managers and admins make batches", async () => {
    const body = { name: "Sneaky", documentIds: data.documentIds, assignment: { mode: "round_robin", annotatorIds: [ann1.userId], annotatorsPerDocument: 1 } };
    expect((await ann1.agent.post(`${base()}/batches`).send(body)).status).toBe(403);
    expect((await dataLead.agent.post(`${base()}/batches`).send(body)).status).toBe(403);
    expect((await ann1.agent.get(`${base()}/batches`)).status).toBe(403);
  });

  it("round robin with k = 2 gives every document both annotators and each one e-mail", async () => {
    const batch = await createBatch({
      name: "Week 1",
      dueDate: "2031-03-31",
      documentIds: data.documentIds,
      assignment: { mode: "round_robin", annotatorIds: [ann1.userId, ann2.userId], annotatorsPerDocument: 2 },
    });
    expect(batch.documents).toHaveLength(3);
    for (const d of batch.documents) expect(d.assignments.map((a) => a.annotatorId).sort()).toEqual([ann1.userId, ann2.userId].sort());
    const mail1 = await waitForMail(ann1.email, /New batch to annotate: Week 1/);
    expect(mail1.text).toContain("3 documents");
    expect(mail1.text).toContain("31 March 2031");
    expect(mail1.link).toBe(`${new URL(mail1.link).origin}/o/${org}/queue`);
    await waitForMail(ann2.email, /New batch to annotate: Week 1/);
    // One message per assignee per batch, however many documents.
    await new Promise((r) => setTimeout(r, 1500));
    expect(testMail().messages().filter((m) => m.to.includes(ann1.email) && /Week 1/.test(m.subject))).toHaveLength(1);
    const statuses = await getDocumentSummaries(org, data.documentIds);
    expect(statuses.map((d) => d.annotationStatus)).toEqual(["in_progress", "in_progress", "in_progress"]);
  });
});

describe("queue and workspace", () => {
  let batch: { id: string; documents: DocumentRow[] };
  let mine: string;
  let theirs: string;

  beforeAll(async () => {
    batch = await createBatch({
      name: "Solo pass",
      documentIds: [data.documentIds[0]],
      assignment: { mode: "by_hand", documents: [{ documentId: data.documentIds[0], annotatorIds: [ann1.userId, ann2.userId] }] },
    });
    mine = assignmentOf(batch, data.documentIds[0]!, ann1.userId);
    theirs = assignmentOf(batch, data.documentIds[0]!, ann2.userId);
  });

  it("the queue lists my unfinished assignments with the next one first", async () => {
    const res = await ann1.agent.get(`/api/orgs/${org}/queue`);
    expect(res.status).toBe(200);
    expect(res.body.items.length).toBeGreaterThanOrEqual(4);
    expect(res.body.items.every((i: { state: string }) => i.state === "open")).toBe(true);
    // Dated batches come before undated ones.
    expect(res.body.next).toMatchObject({ batchName: "Week 1", dueDate: "2031-03-31", corpusName: expect.any(String) });
    expect(res.body.items.map((i: { assignmentId: string }) => i.assignmentId)).toContain(mine);
    expect(res.body.items.map((i: { assignmentId: string }) => i.assignmentId)).not.toContain(theirs);
  });

  it("annotators open only their own assignments; managers open all", async () => {
    const own = await ann1.agent.get(`${base()}/assignments/${mine}`);
    expect(own.status).toBe(200);
    expect(own.body).toMatchObject({ id: mine, state: "open", version: 0, canEdit: true, spans: [] });
    expect(own.body.document.text).toBe(textA);
    expect(own.body.document.tokens.starts.length).toBeGreaterThan(10);
    expect(own.body.entityTypes.map((t: { name: string }) => t.name)).toEqual(["PERSON", "PLACE", "ORG"]);
    expect(own.body.suggestions).toEqual([
      { ...find(textA, "Mira Quell"), type: "PERSON", confidence: 0.92 },
      { ...find(textA, "Saltmarsh"), type: "PLACE", confidence: 0.41 },
    ]);
    expect((await ann1.agent.get(`${base()}/assignments/${theirs}`)).status).toBe(404);
    expect((await dataLead.agent.get(`${base()}/assignments/${theirs}`)).status).toBe(404);
    const asManager = await manager.agent.get(`${base()}/assignments/${theirs}`);
    expect(asManager.status).toBe(200);
    expect(asManager.body.canEdit).toBe(false);
    // A manager may look but not write into an annotator's work.
    expect((await manager.agent.put(`${base()}/assignments/${theirs}`).send({ version: 0, spans: [] })).status).toBe(403);
    // The id under another corpus is unknown.
    const other = await createAnnotationData(org, { userId: manager.userId, email: manager.email }, { types: [], documents: [] });
    expect((await ann1.agent.get(`/api/orgs/${org}/corpora/${other.corpusId}/assignments/${mine}`)).status).toBe(404);
  });

  it("refuses spans off token boundaries, overlapping, of unknown types or past the text, and keeps the version", async () => {
    const mira = find(textA, "Mira Quell");
    const bad: Array<[object[], RegExp]> = [
      [[{ start: mira.start + 1, end: mira.end, type: "PERSON" }], /does not begin where a token begins/],
      [[{ start: mira.start, end: mira.end - 1, type: "PERSON" }], /does not end where a token ends/],
      [[{ ...mira, type: "PERSON" }, { start: mira.start + 5, end: mira.end + 4, type: "PLACE" }], /overlap.*flat/],
      [[{ ...mira, type: "VEHICLE" }], /"VEHICLE"/],
      [[{ start: 0, end: textA.length + 3, type: "PERSON" }], /past the end/],
    ];
    for (const [spans, message] of bad) {
      const res = await ann1.agent.put(`${base()}/assignments/${mine}`).send({ version: 0, spans });
      expect(res.status, JSON.stringify(res.body)).toBe(400);
      expect(res.body.error.message).toMatch(message);
    }
    expect((await ann1.agent.put(`${base()}/assignments/${mine}`).send({ version: 0, spans: [{ start: 3, end: 1, type: "PERSON" }] })).status).toBe(400);
    expect((await ann1.agent.get(`${base()}/assignments/${mine}`)).body.version).toBe(0);
  });

  it("saves with versions: a stale save answers 409 with the server's spans", async () => {
    const mira = { ...find(textA, "Mira Quell"), type: "PERSON", origin: "suggested" };
    const first = await ann1.agent.put(`${base()}/assignments/${mine}`).send({ version: 0, spans: [mira], dismissedSuggestions: [{ ...find(textA, "Saltmarsh"), type: "PLACE" }] });
    expect(first.status, JSON.stringify(first.body)).toBe(200);
    expect(first.body).toMatchObject({ version: 1, state: "in_progress" });
    const stale = await ann1.agent.put(`${base()}/assignments/${mine}`).send({ version: 0, spans: [] });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe("stale_version");
    expect(stale.body.error.details).toEqual({ version: 1, state: "in_progress", spans: [mira], dismissedSuggestions: [{ ...find(textA, "Saltmarsh"), type: "PLACE" }] });
    const view = await ann1.agent.get(`${base()}/assignments/${mine}`);
    expect(view.body.spans).toEqual([mira]);
    // Both suggestions are decided: one accepted as a span, one dismissed.
    expect(view.body.suggestions).toEqual([]);
  });

  it("of concurrent saves naming the same version exactly one changes the row; those that sent other spans get 409", async () => {
    const current = (await ann1.agent.get(`${base()}/assignments/${mine}`)).body.version as number;
    const tobin = find(textA, "Tobin Vale");
    const typeOf = (i: number) => (i % 2 ? "PERSON" : "ORG");
    const attempts = await Promise.all(
      Array.from({ length: 12 }, (_, i) => ann1.agent.put(`${base()}/assignments/${mine}`).send({ version: current, spans: [{ ...tobin, type: typeOf(i) }] })),
    );
    const after = (await ann1.agent.get(`${base()}/assignments/${mine}`)).body;
    expect(after.version).toBe(current + 1);
    expect(after.spans).toHaveLength(1);
    const winningType = after.spans[0].type as string;
    // A save that sent exactly what the winner stored holds what the server holds: it is told the
    // stored version (as a retry of a save whose answer was lost would be), nothing is bumped.
    attempts.forEach((r, i) => {
      if (typeOf(i) === winningType) {
        expect(r.status, JSON.stringify(r.body)).toBe(200);
        expect(r.body.version).toBe(current + 1);
      } else {
        expect(r.status, JSON.stringify(r.body)).toBe(409);
        expect(r.body.error.details.version).toBeGreaterThanOrEqual(current + 1);
      }
    });
  });

  it("submit needs the latest version and makes the assignment read-only", async () => {
    const view = (await ann1.agent.get(`${base()}/assignments/${mine}`)).body;
    expect((await ann1.agent.post(`${base()}/assignments/${mine}/submit`).send({ version: view.version - 1 })).status).toBe(409);
    expect((await ann2.agent.post(`${base()}/assignments/${mine}/submit`).send({ version: view.version })).status).toBe(404);
    const done = await ann1.agent.post(`${base()}/assignments/${mine}/submit`).send({ version: view.version });
    expect(done.status, JSON.stringify(done.body)).toBe(200);
    expect(done.body.state).toBe("submitted");
    const locked = await ann1.agent.put(`${base()}/assignments/${mine}`).send({ version: done.body.version, spans: [] });
    expect(locked.status).toBe(409);
    expect(locked.body.error.code).toBe("assignment_locked");
    expect((await ann1.agent.get(`${base()}/assignments/${mine}`)).body).toMatchObject({ state: "submitted", canEdit: false });
    const queue = (await ann1.agent.get(`/api/orgs/${org}/queue`)).body;
    expect(queue.items.map((i: { assignmentId: string }) => i.assignmentId)).not.toContain(mine);
    // Submitted work moves to the "Done" list, the latest first; nobody else's appears there.
    expect(queue.done[0]).toMatchObject({ assignmentId: mine, state: "submitted" });
    expect(queue.done.map((i: { assignmentId: string }) => i.assignmentId)).not.toContain(theirs);
  });
});

async function annotate(user: SignedIn, assignmentId: string, spans: object[]): Promise<void> {
  const view = await user.agent.get(`${base()}/assignments/${assignmentId}`);
  const saved = await user.agent.put(`${base()}/assignments/${assignmentId}`).send({ version: view.body.version, spans });
  expect(saved.status, JSON.stringify(saved.body)).toBe(200);
  const submitted = await user.agent.post(`${base()}/assignments/${assignmentId}/submit`).send({ version: saved.body.version });
  expect(submitted.status, JSON.stringify(submitted.body)).toBe(200);
}

describe("review", () => {
  it("one annotator: return with a comment (e-mail), fix, resubmit, accept → gold", async () => {
    const batch = await createBatch({
      name: "Single review",
      documentIds: [data.documentIds[1]],
      assignment: { mode: "round_robin", annotatorIds: [ann1.userId], annotatorsPerDocument: 1 },
    });
    const id = assignmentOf(batch, data.documentIds[1]!, ann1.userId);
    // Nothing to review before submission.
    expect((await manager.agent.post(`${base()}/assignments/${id}/accept`)).status).toBe(409);
    await annotate(ann1, id, [{ ...find(textB, "Orla Finch"), type: "PERSON" }]);
    // The document is still open in "Week 1", so it is not all submitted yet.
    expect((await getDocumentSummaries(org, [data.documentIds[1]!]))[0]!.annotationStatus).toBe("in_progress");

    const list = await manager.agent.get(`/api/orgs/${org}/review`).query({ batchId: batch.id });
    expect(list.status).toBe(200);
    expect(list.body.items).toEqual([
      expect.objectContaining({ batchId: batch.id, documentId: data.documentIds[1], ready: true, assignments: [expect.objectContaining({ id, state: "submitted", annotatorName: "Ines Annotator" })] }),
    ]);
    expect((await ann1.agent.get(`/api/orgs/${org}/review`)).status).toBe(403);
    expect((await manager.agent.post(`${base()}/assignments/${id}/return`).send({ comment: "  " })).status).toBe(400);

    const returned = await manager.agent.post(`${base()}/assignments/${id}/return`).send({ comment: "Gullhaven is a place too." });
    expect(returned.status).toBe(204);
    const mail = await waitForMail(ann1.email, /Sent back for changes: Pier inspection/);
    expect(mail.text).toContain("Gullhaven is a place too.");
    expect(mail.link).toContain(`/o/${org}/corpora/${data.corpusId}/assignments/${id}`);
    const view = (await ann1.agent.get(`${base()}/assignments/${id}`)).body;
    expect(view).toMatchObject({ state: "returned", canEdit: true, reviewComment: "Gullhaven is a place too." });
    const queue = (await ann1.agent.get(`/api/orgs/${org}/queue`)).body;
    expect(queue.next).toMatchObject({ assignmentId: id, state: "returned" });

    await annotate(ann1, id, [...view.spans.map(({ start, end, type }: { start: number; end: number; type: string }) => ({ start, end, type })), { ...find(textB, "Gullhaven"), type: "PLACE" }]);
    expect((await manager.agent.post(`${base()}/assignments/${id}/accept`)).status).toBe(204);
    expect(await getGoldSpans(org, data.documentIds[1]!)).toEqual([
      { ...find(textB, "Orla Finch"), type: "PERSON" },
      { ...find(textB, "Gullhaven"), type: "PLACE" },
    ]);
    expect((await getDocumentSummaries(org, [data.documentIds[1]!]))[0]!.annotationStatus).toBe("gold");
    expect((await ann1.agent.get(`${base()}/assignments/${id}`)).body.state).toBe("accepted");
    expect((await manager.agent.post(`${base()}/assignments/${id}/accept`)).status).toBe(409);
    const detail = (await manager.agent.get(`${base()}/batches/${batch.id}`)).body;
    expect(detail).toMatchObject({ documentsSettled: 1, assignments: { total: 1, accepted: 1 } });
  });

  it("two annotators: disagreements, settle after both submit, agreement figures", async () => {
    const batch = await createBatch({
      name: "Overlap review",
      documentIds: [data.documentIds[2]],
      assignment: { mode: "round_robin", annotatorIds: [ann1.userId, ann2.userId], annotatorsPerDocument: 2 },
    });
    const a1 = assignmentOf(batch, data.documentIds[2]!, ann1.userId);
    const a2 = assignmentOf(batch, data.documentIds[2]!, ann2.userId);
    const brack = find(textC, "Ostrandel Freight");
    const letter = find(textC, "letter");
    await annotate(ann1, a1, [{ ...brack, type: "ORG" }, { ...letter, type: "PLACE" }]);
    const settleUrl = `${base()}/batches/${batch.id}/documents/${data.documentIds[2]}/settle`;
    const early = await manager.agent.post(settleUrl).send({ spans: [{ ...brack, type: "ORG" }] });
    expect(early.status).toBe(409);
    expect(early.body.error.message).toMatch(/1 of 2/);
    await annotate(ann2, a2, [{ ...brack, type: "ORG" }]);
    expect((await manager.agent.post(`${base()}/assignments/${a1}/accept`)).status).toBe(409);

    const review = await manager.agent.get(`${base()}/batches/${batch.id}/documents/${data.documentIds[2]}/review`);
    expect(review.status).toBe(200);
    expect(review.body.ready).toBe(true);
    expect(review.body.assignments.map((a: { annotator: { name: string }; spans: object[] }) => [a.annotator.name, a.spans.length])).toEqual([
      ["Ines Annotator", 2],
      ["Jory Annotator", 1],
    ]);

    const agreement = await manager.agent.get(`${base()}/batches/${batch.id}/agreement`);
    expect(agreement.status).toBe(200);
    expect(agreement.body.pairs).toHaveLength(1);
    // Worked by hand: one shared span, one only Ines marked: F1 = 2·1/(2·1 + 1 + 0) = 2/3.
    expect(agreement.body.pairs[0].f1).toBeCloseTo(2 / 3, 12);
    expect(agreement.body.pairs[0]).toMatchObject({ matched: 1, documents: 1 });
    expect(agreement.body.overall.f1).toBeCloseTo(2 / 3, 12);
    // Cohen's kappa, worked by hand with Cohen (1960), "A Coefficient of Agreement for Nominal
    // Scales", Educational and Psychological Measurement 20(1), eq. (1): κ = (pₒ − pₑ)/(1 − pₑ).
    // The 8 tokens "Nobody from Ostrandel Freight answered the letter ." are labelled
    // Ines: O O B-ORG I-ORG O O B-PLACE O, Jory: O O B-ORG I-ORG O O O O. pₒ = 7/8;
    // marginals Ines O 5, B-ORG 1, I-ORG 1, B-PLACE 1 and Jory O 6, B-ORG 1, I-ORG 1, so
    // pₑ = (5·6 + 1·1 + 1·1)/8² = 1/2 and κ = (7/8 − 1/2)/(1/2) = 3/4.
    expect(agreement.body.pairs[0].tokens).toBe(8);
    expect(agreement.body.pairs[0].kappa).toBeCloseTo(0.75, 12);
    expect(agreement.body.overall.kappa).toBeCloseTo(0.75, 12);

    // A settled result that cuts a token is refused and nothing changes.
    const bad = await manager.agent.post(settleUrl).send({ spans: [{ start: brack.start, end: brack.end - 2, type: "ORG" }] });
    expect(bad.status).toBe(400);
    expect((await manager.agent.post(settleUrl).send({ spans: [{ ...brack, type: "ORG" }] })).status).toBe(204);
    expect(await getGoldSpans(org, data.documentIds[2]!)).toEqual([{ ...brack, type: "ORG" }]);
    expect((await manager.agent.post(settleUrl).send({ spans: [] })).body.error.code).toBe("already_settled");
    const detail = (await manager.agent.get(`${base()}/batches/${batch.id}`)).body;
    expect(detail.annotators.map((a: { name: string; assignments: { accepted: number } }) => [a.name, a.assignments.accepted])).toEqual([
      ["Ines Annotator", 1],
      ["Jory Annotator", 1],
    ]);
  });
});

describe("deleting an entity type", () => {
  it("counts and removes its spans in assignments", async () => {
    const local = await createAnnotationData(org, { userId: manager.userId, email: manager.email }, {
      types: [{ name: "PERSON" }, { name: "SHIP" }],
      documents: [{ title: "Launch", text: "The Gannet left port with Edda Rusk aboard." }],
    });
    const res = await manager.agent.post(`/api/orgs/${org}/corpora/${local.corpusId}/batches`).send({
      name: "Ships",
      documentIds: local.documentIds,
      assignment: { mode: "round_robin", annotatorIds: [ann2.userId], annotatorsPerDocument: 1 },
    });
    const detail = (await manager.agent.get(`/api/orgs/${org}/corpora/${local.corpusId}/batches/${res.body.id}`)).body;
    const id = detail.documents[0].assignments[0].id;
    const text = "The Gannet left port with Edda Rusk aboard.";
    const url = `/api/orgs/${org}/corpora/${local.corpusId}/assignments/${id}`;
    await ann2.agent.put(url).send({ version: 0, spans: [{ ...find(text, "Gannet"), type: "SHIP" }, { ...find(text, "Edda Rusk"), type: "PERSON" }] });
    const actor = { userId: manager.userId, email: manager.email };
    await expect(deleteEntityType(org, local.corpusId, local.types.SHIP!.id, false, actor)).rejects.toMatchObject({
      status: 409,
      details: expect.objectContaining({ byStore: expect.objectContaining({ assignments: 1 }) }),
    });
    await deleteEntityType(org, local.corpusId, local.types.SHIP!.id, true, actor);
    const view = (await ann2.agent.get(url)).body;
    expect(view.spans).toEqual([{ ...find(text, "Edda Rusk"), type: "PERSON", origin: "human" }]);
    expect(view.version).toBe(2);
  });
});
