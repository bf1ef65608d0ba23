import { documentUncertainty } from "@tagloom/tagger";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/knex";
import { sentenceWords, tagText, tokensOfText } from "@/tagging/tag-text";
import { createAnnotationData } from "./support/annotation-data";
import { uploadAndWait } from "./support/corpora";
import { type TestServer, addSignedInMember, signUpFounder, startTestServer } from "./support/http";
import { labelledDocuments, trainTestModel } from "./support/tagging-data";
import { createTestTagger } from "./support/taggers";
import { startTestWorkers } from "./support/workers";

let server: TestServer;
beforeAll(async () => {
  server = await startTestServer();
  await startTestWorkers();
});

async function waitForRuns(agent: TestServer["agent"] extends () => infer A ? A : never, base: string, timeoutMs = 30_000) {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const res = await agent.get(`${base}/suggester`);
    if (res.status !== 200) throw new Error(`suggester status: ${res.status} ${JSON.stringify(res.body)}`);
    if (res.body.runs.every((r: { finishedAt: string | null }) => r.finishedAt !== null)) return res.body;
    if (Date.now() > deadline) throw new Error(`suggestion runs unfinished: ${JSON.stringify(res.body.runs)}`);
    await new Promise((r) => setTimeout(r, 150));
  }
}

const texts = labelledDocuments(8, 2, 100).map((d) => d.text);
// Documents that vary in how well the tagger knows them, for the ranking.
texts.push("Quiet words only, nothing named at all here.", "Unfamiliar Brackwater Hollins wrote to Pennet Gorse near Dunmire Fold.");

async function setUp(orgName: string) {
  const admin = await signUpFounder(server, { organizationName: orgName });
  const lead = await addSignedInMember(server, admin.orgId, "data_lead");
  const manager = await addSignedInMember(server, admin.orgId, "manager");
  const annotator = await addSignedInMember(server, admin.orgId, "annotator", "Kestrel Dunn");
  const data = await createAnnotationData(admin.orgId, admin, {
    types: [{ name: "PARTY", hotkey: "p" }, { name: "PLACE", hotkey: "l" }],
    documents: texts.map((text, i) => ({ title: `Note ${i + 1}`, text })),
  });
  const a = trainTestModel(labelledDocuments(30));
  // B knows fewer sentences, so its suggestions differ from A's.
  const b = trainTestModel(labelledDocuments(2, 2, 7));
  const taggerA = await createTestTagger(admin.orgId, data.corpusId, a.json, admin.userId);
  const taggerB = await createTestTagger(admin.orgId, data.corpusId, b.json, admin.userId);
  const base = `/api/orgs/${admin.orgId}/corpora/${data.corpusId}`;
  return { admin, lead, manager, annotator, data, a, b, taggerA, taggerB, base };
}

async function taggerRows(documentIds: string[]) {
  return db("document_suggestions").whereIn("document_id", documentIds).select("document_id", "source", "tagger_id", "spans");
}

describe("the corpus suggester", () => {
  it("tags every document without gold, keeps human spans, and leaves one set after two changes", async () => {
    const s = await setUp("Marrowby Survey");
    // One document is gold already: it gets no suggestions.
    await db("documents").where({ id: s.data.documentIds[0] }).update({ annotation_status: "gold" });
    expect((await s.manager.agent.put(`${s.base}/suggester`).send({ taggerId: s.taggerA.id })).status).toBe(403);
    const set = await s.lead.agent.put(`${s.base}/suggester`).send({ taggerId: s.taggerA.id });
    expect(set.status, JSON.stringify(set.body)).toBe(200);
    expect(set.body.tagger).toMatchObject({ id: s.taggerA.id, version: s.taggerA.version });
    const status = await waitForRuns(s.lead.agent, s.base);
    expect(status.runs[0]).toMatchObject({ reason: "suggester_changed", documentsTotal: texts.length - 1, documentsDone: texts.length - 1 });

    const rows = await taggerRows(s.data.documentIds);
    expect(rows.map((r) => r.document_id).sort()).toEqual(s.data.documentIds.slice(1).sort());
    const types = { [s.data.types.PARTY!.id]: "PARTY", [s.data.types.PLACE!.id]: "PLACE" };
    for (const r of rows) {
      const text = texts[s.data.documentIds.indexOf(r.document_id)]!;
      expect(r).toMatchObject({ source: "tagger", tagger_id: s.taggerA.id });
      // Stored spans are the tagging API's spans of the same text (confidence = chunk marginal).
      expect(r.spans.map((x: { start: number; end: number; typeId: string; confidence: number }) => ({ start: x.start, end: x.end, type: types[x.typeId], confidence: x.confidence }))).toEqual(
        tagText(s.a.model, text).map(({ text: _t, ...rest }) => rest),
      );
    }

    // The annotator sees A's suggestions with confidence, accepts two, rejects one, marks one span.
    const batch = await s.manager.agent.post(`${s.base}/batches`).send({
      name: "First look",
      documentIds: [s.data.documentIds[1]],
      assignment: { mode: "round_robin", annotatorIds: [s.annotator.userId], annotatorsPerDocument: 1 },
    });
    expect(batch.status, JSON.stringify(batch.body)).toBe(201);
    const queue = await s.annotator.agent.get(`/api/orgs/${s.admin.orgId}/queue`);
    const assignmentId = queue.body.items[0].assignmentId as string;
    const view = await s.annotator.agent.get(`${s.base}/assignments/${assignmentId}`);
    const suggestions = view.body.suggestions as Array<{ start: number; end: number; type: string; confidence: number }>;
    expect(suggestions.length).toBeGreaterThanOrEqual(3);
    const [first, second, third] = suggestions;
    const human = { start: 0, end: 2, type: "PLACE", origin: "human" };
    const save = await s.annotator.agent.put(`${s.base}/assignments/${assignmentId}`).send({
      version: view.body.version,
      spans: [human, { ...pick(first!), origin: "suggested" }, { ...pick(second!), origin: "suggested" }].sort((x, y) => x.start - y.start),
      dismissedSuggestions: [pick(third!)],
    });
    expect(save.status, JSON.stringify(save.body)).toBe(200);
    const judged = (await s.lead.agent.get(`${s.base}/suggester`)).body.judgement;
    expect(judged).toEqual({ accepted: 2, rejected: 1, precision: 2 / 3 });
    const assignmentBefore = await db("assignments").where({ id: assignmentId }).first("spans", "dismissed_suggestions", "version");

    // Change twice without waiting: B, then A again.
    expect((await s.lead.agent.put(`${s.base}/suggester`).send({ taggerId: s.taggerB.id })).status).toBe(200);
    expect((await s.lead.agent.put(`${s.base}/suggester`).send({ taggerId: s.taggerA.id })).status).toBe(200);
    await waitForRuns(s.lead.agent, s.base);
    // Let any shard of B that was already running finish (it must write nothing).
    await new Promise((r) => setTimeout(r, 1500));
    const after = await taggerRows(s.data.documentIds);
    expect(after).toHaveLength(texts.length - 1);
    expect(new Set(after.map((r) => r.tagger_id))).toEqual(new Set([s.taggerA.id]));
    expect(await db("assignments").where({ id: assignmentId }).first("spans", "dismissed_suggestions", "version")).toEqual(assignmentBefore);
    const again = await s.annotator.agent.get(`${s.base}/assignments/${assignmentId}`);
    expect(again.body.spans).toContainEqual(human);
    // Decided suggestions are not offered again.
    const pendingKeys = new Set(again.body.suggestions.map((x: { start: number; end: number; type: string }) => `${x.start}:${x.end}:${x.type}`));
    for (const d of [first!, second!, third!]) expect(pendingKeys.has(`${d.start}:${d.end}:${d.type}`)).toBe(false);

    // None: the tagger's untouched suggestions go, the annotator's spans stay.
    expect((await s.lead.agent.put(`${s.base}/suggester`).send({ taggerId: null })).status).toBe(200);
    expect(await taggerRows(s.data.documentIds)).toEqual([]);
    expect(await db("assignments").where({ id: assignmentId }).first("spans", "dismissed_suggestions", "version")).toEqual(assignmentBefore);

    const audit = await s.admin.agent.get(`/api/orgs/${s.admin.orgId}/audit?action=corpus.suggester_changed`);
    expect(audit.body.items.map((e: { details: { to: string | null } }) => e.details.to)).toEqual([null, s.taggerA.id, s.taggerB.id, s.taggerA.id]);
  });

  it("refuses a tagger of another corpus and unknown ids, and changes nothing", async () => {
    const s = await setUp("Tallow Reach");
    const other = await createAnnotationData(s.admin.orgId, s.admin, { types: [{ name: "PARTY" }], documents: [{ title: "x", text: "Mira Quell." }] });
    const foreign = await createTestTagger(s.admin.orgId, other.corpusId, s.a.json, s.admin.userId);
    for (const taggerId of [foreign.id, "00000000-0000-4000-8000-000000000000"]) {
      const res = await s.lead.agent.put(`${s.base}/suggester`).send({ taggerId });
      expect(res.status).toBe(409);
      expect(res.body.error.code).toBe("tagger_unusable");
    }
    expect((await s.lead.agent.put(`${s.base}/suggester`).send({ taggerId: "nope" })).status).toBe(400);
    expect((await s.lead.agent.get(`${s.base}/suggester`)).body.tagger).toBeNull();
    const uncertain = await s.manager.agent.get(`${s.base}/uncertain`);
    expect(uncertain.status).toBe(409);
    expect(uncertain.body.error.code).toBe("no_suggester");
  });

  it("suggests for newly uploaded documents and ranks documents by the engine's mean token entropy", async () => {
    const s = await setUp("Gorsefield Papers");
    await s.lead.agent.put(`${s.base}/suggester`).send({ taggerId: s.taggerA.id });
    await waitForRuns(s.lead.agent, s.base);
    const line = JSON.stringify({ title: "Fresh note", text: "On day 2 Orla Finch met Ines Ashby in Brindlecombe." });
    const up = await uploadAndWait(s.manager.agent, s.admin.orgId, s.data.corpusId, [{ name: "fresh.jsonl", content: line }]);
    expect(up.byName["fresh.jsonl"]?.state).toBe("ready");
    const status = await waitForRuns(s.lead.agent, s.base);
    expect(status.runs[0]).toMatchObject({ reason: "new_documents", documentsTotal: 1, documentsDone: 1 });
    const fresh = await db("documents").where({ corpus_id: s.data.corpusId, title: "Fresh note" }).first("id", "text");
    const rows = await taggerRows([fresh.id]);
    expect(rows).toHaveLength(1);
    expect(rows[0].spans.length).toBe(3);
    expect(rows[0].spans.map((x: { start: number; end: number }) => [x.start, x.end])).toEqual(tagText(s.a.model, fresh.text).map((x) => [x.start, x.end]));

    // Uploaded as suggestions, one with a suggested span (kept) and one with none (the tagger fills it).
    const imported = [
      { title: "Imported guess", text: "Mira Quell met Tobin Vale in Saltmarsh.", spans: [{ start: 0, end: 10, type: "PARTY", confidence: 0.5 }] },
      { title: "Imported blank", text: "On day 5 Orla Finch met Ines Ashby in Brindlecombe.", spans: [] },
    ];
    const up2 = await uploadAndWait(s.manager.agent, s.admin.orgId, s.data.corpusId, [{ name: "imported.jsonl", content: imported.map((l) => JSON.stringify(l)).join("\n") }], { spanMode: "suggested" });
    expect(up2.byName["imported.jsonl"]?.state).toBe("ready");
    const status2 = await waitForRuns(s.lead.agent, s.base);
    expect(status2.runs[0]).toMatchObject({ reason: "new_documents", documentsTotal: 2, documentsDone: 2 });
    const [guess, blank] = await Promise.all(imported.map((l) => db("documents").where({ corpus_id: s.data.corpusId, title: l.title }).first("id", "text")));
    const [guessRow] = await taggerRows([guess.id]);
    expect(guessRow).toMatchObject({ source: "import", spans: [{ start: 0, end: 10, typeId: s.data.types.PARTY!.id, confidence: 0.5 }] });
    const [blankRow] = await taggerRows([blank.id]);
    expect(blankRow).toMatchObject({ source: "tagger", tagger_id: s.taggerA.id });
    expect(blankRow.spans.map((x: { start: number; end: number }) => [x.start, x.end])).toEqual(tagText(s.a.model, blank.text).map((x) => [x.start, x.end]));
    expect(blankRow.spans.length).toBe(3);

    const ranking = await s.manager.agent.get(`${s.base}/uncertain?limit=5`);
    expect(ranking.status, JSON.stringify(ranking.body)).toBe(200);
    expect(ranking.body).toMatchObject({ measure: "mean_token_entropy", considered: texts.length + 3, tagger: { id: s.taggerA.id } });
    // The engine's own scores, computed here from the document texts, give the same order.
    const all = await db("documents").where({ corpus_id: s.data.corpusId }).select("id", "text");
    const expected = all
      .map((d) => ({ id: d.id as string, score: documentUncertainty(s.a.model, sentenceWords(d.text, tokensOfText(d.text))).meanEntropy }))
      .sort((x, y) => y.score - x.score || (x.id < y.id ? -1 : 1));
    expect(ranking.body.items.map((d: { id: string }) => d.id)).toEqual(expected.slice(0, 5).map((d) => d.id));
    ranking.body.items.forEach((d: { score: number; reason: string; lowConfidenceSpans: number; spans: number }, i: number) => {
      expect(d.score).toBeCloseTo(expected[i]!.score, 12);
      expect(d.reason).toMatch(d.spans === 0 ? /no entities suggested/ : new RegExp(`low-confidence spans: ${d.lowConfidenceSpans} of ${d.spans}`));
    });
    expect(ranking.body.items[0].score).toBeGreaterThan(ranking.body.items[4].score);
    expect((await s.annotator.agent.get(`${s.base}/uncertain`)).status).toBe(403);
  });
});

function pick(s: { start: number; end: number; type: string }) {
  return { start: s.start, end: s.end, type: s.type };
}
