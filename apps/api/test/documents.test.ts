import type { DocumentDetail, DocumentListItem } from "@tagloom/contracts";
import { beforeAll, describe, expect, it } from "vitest";
import { registerEntityTypeSpanStore } from "@/corpora/entity-types.service";
import { createCorpusWithTypes, uploadAndWait } from "./support/corpora";
import { type SignedIn, type TestServer, addSignedInMember, signUpFounder, startTestServer } from "./support/http";
import { startTestWorkers } from "./support/workers";

let server: TestServer;
let admin: SignedIn;
let manager: SignedIn;
let annotator: SignedIn;
/** A data lead reads documents; annotators may not (they see documents only through their assignments). */
let reader: SignedIn;
let corpusId: string;
let typeIds: Record<string, string>;

const animals = ["otter", "heron", "badger", "lynx", "marten", "stoat", "vole", "wren", "finch", "newt", "toad", "hare"];

beforeAll(async () => {
  server = await startTestServer();
  await startTestWorkers();
  admin = await signUpFounder(server, { organizationName: "Documents Org" });
  manager = await addSignedInMember(server, admin.orgId, "manager");
  annotator = await addSignedInMember(server, admin.orgId, "annotator");
  reader = await addSignedInMember(server, admin.orgId, "data_lead");
  ({ corpusId, typeIds } = await createCorpusWithTypes(manager.agent, admin.orgId, "Field notes", ["PARTY", "PLACE"]));
  // 12 gold documents of growing length, each naming one animal, plus 3 plain text files.
  const lines = animals.map((animal, i) =>
    JSON.stringify({
      title: `Note ${String.fromCharCode(76 - i)} ${animal}`,
      text: `Ada Brightwater saw a ${animal} near Lowmere.${" It stayed.".repeat(i)}`,
      spans: [{ start: 0, end: 15, type: "PARTY" }, { start: 22 + animal.length + 6, end: 22 + animal.length + 13, type: "PLACE" }],
    }),
  );
  await uploadAndWait(manager.agent, admin.orgId, corpusId, [{ name: "notes.jsonl", content: lines.join("\n") }]);
  await uploadAndWait(
    manager.agent,
    admin.orgId,
    corpusId,
    [
      { name: "river.txt", content: "The river report mentions a heron and a kingfisher." },
      { name: "woods.txt", content: "Woods survey: no heron seen, only deer." },
      { name: "meadow.txt", content: "Meadow walk with Quillmark Ltd. staff." },
    ],
    { spanMode: "suggested" },
  );
});

const docsPath = () => `/api/orgs/${admin.orgId}/corpora/${corpusId}/documents`;

async function listAll(query: string, limit = 4): Promise<DocumentListItem[]> {
  const out: DocumentListItem[] = [];
  let cursor: string | null = null;
  for (let guard = 0; guard < 100; guard++) {
    const res: { status: number; body: { items: DocumentListItem[]; nextCursor: string | null } } = await reader.agent.get(
      `${docsPath()}?${query}&limit=${limit}${cursor ? `&cursor=${encodeURIComponent(cursor)}` : ""}`,
    );
    expect(res.status).toBe(200);
    out.push(...res.body.items);
    cursor = res.body.nextCursor;
    if (!cursor) return out;
  }
  throw new Error("too many pages");
}

describe("documents table", () => {
  it("pages through every document exactly once in each sort and direction", async () => {
    for (const sort of ["created", "title", "tokens"]) {
      for (const dir of ["asc", "desc"]) {
        const rows = await listAll(`sort=${sort}&dir=${dir}`, 4);
        expect(rows).toHaveLength(15);
        expect(new Set(rows.map((r) => r.id)).size).toBe(15);
        const keys = rows.map((r) => (sort === "title" ? r.title : sort === "tokens" ? r.tokenCount : r.createdAt));
        const sorted = [...keys].sort((a, b) => (a < b ? -1 : a > b ? 1 : 0));
        expect(keys).toEqual(dir === "asc" ? sorted : sorted.reverse());
      }
    }
  });

  it("filters by annotation status and split, and finds documents by a word", async () => {
    expect(await listAll("status=gold")).toHaveLength(12);
    expect(await listAll("status=none")).toHaveLength(3);
    expect(await listAll("split=none")).toHaveLength(15);
    const heron = await listAll("q=heron");
    expect(heron.map((d) => d.title).sort()).toEqual(["Note K heron", "river", "woods"]);
    // Web-search syntax: a quoted phrase, and a word to leave out.
    expect((await listAll(`q=${encodeURIComponent('"no heron"')}`)).map((d) => d.title)).toEqual(["woods"]);
    expect((await listAll(`q=${encodeURIComponent("heron -kingfisher -deer")}`)).map((d) => d.title)).toEqual(["Note K heron"]);
    expect(await listAll("q=quillmark")).toHaveLength(1);
    expect(await listAll("q=zebra")).toHaveLength(0);
  });

  it("refuses bad query values", async () => {
    expect((await reader.agent.get(`${docsPath()}?sort=size`)).status).toBe(400);
    expect((await reader.agent.get(`${docsPath()}?status=done`)).status).toBe(400);
    expect((await reader.agent.get(`${docsPath()}?sort=tokens&cursor=${Buffer.from('["x","00000000-0000-4000-8000-000000000000"]').toString("base64url")}`)).status).toBe(400);
  });

  it("shows a document with its text, tokens, gold spans and suggestions", async () => {
    const [heron] = await listAll("q=heron&status=gold");
    const res = await reader.agent.get(`${docsPath()}/${heron!.id}`);
    const doc = res.body as DocumentDetail;
    expect(doc.gold.map((s) => doc.text.slice(s.start, s.end))).toEqual(["Ada Brightwater", "Lowmere"]);
    expect(doc.tokens.starts).toHaveLength(doc.tokenCount);
    const [river] = await listAll("q=kingfisher");
    expect((await reader.agent.get(`${docsPath()}/${river!.id}`)).body.suggestions).toEqual([]);
  });

  it("refuses annotators the documents, their gold and the uploads (403), changing nothing", async () => {
    const [heron] = await listAll("q=heron&status=gold");
    for (const path of [docsPath(), `${docsPath()}/${heron!.id}`, `/api/orgs/${admin.orgId}/corpora/${corpusId}/uploads`, `/api/orgs/${admin.orgId}/corpora/${corpusId}/files`]) {
      const res = await annotator.agent.get(path);
      expect(res.status, path).toBe(403);
      expect(res.body.error.code).toBe("forbidden");
      expect(JSON.stringify(res.body)).not.toContain("Brightwater");
    }
    expect((await reader.agent.get(`${docsPath()}/${heron!.id}`)).status).toBe(200);
  });

  it("answers 404 for a document under another corpus of the organization", async () => {
    const [any] = await listAll("status=gold");
    const { corpusId: otherCorpus } = await createCorpusWithTypes(manager.agent, admin.orgId, "Other notes");
    const res = await reader.agent.get(`/api/orgs/${admin.orgId}/corpora/${otherCorpus}/documents/${any!.id}`);
    expect(res.status).toBe(404);
  });
});

describe("splits", () => {
  it("sets and clears the split of chosen documents", async () => {
    const rows = await listAll("status=none");
    const ids = rows.map((r) => r.id);
    const res = await manager.agent.post(`${docsPath()}/split`).send({ documentIds: ids, split: "test" });
    expect(res.body).toEqual({ train: 0, test: 3, cleared: 0 });
    expect(await listAll("split=test")).toHaveLength(3);
    await manager.agent.post(`${docsPath()}/split`).send({ documentIds: ids, split: null });
    expect(await listAll("split=none")).toHaveLength(15);
  });

  it("refuses unknown ids without changing anything, and annotators may not set splits", async () => {
    const [one] = await listAll("status=gold");
    const res = await manager.agent.post(`${docsPath()}/split`).send({ documentIds: [one!.id, "00000000-0000-4000-8000-000000000000"], split: "train" });
    expect(res.status).toBe(404);
    expect(await listAll("split=train")).toHaveLength(0);
    expect((await annotator.agent.post(`${docsPath()}/split`).send({ documentIds: [one!.id], split: "train" })).status).toBe(403);
    expect((await manager.agent.post(`${docsPath()}/split`).send({ testPercent: 120, seed: 1 })).status).toBe(400);
  });

  it("splits at random by a seeded percentage, the same way for the same seed", async () => {
    const split = async (seed: number) => {
      const res = await manager.agent.post(`${docsPath()}/split`).send({ testPercent: 20, seed });
      expect(res.body).toEqual({ train: 12, test: 3, cleared: 0 }); // round(15 × 20 / 100) = 3
      return (await listAll("split=test")).map((d) => d.id).sort();
    };
    const first = await split(42);
    expect(await split(42)).toEqual(first);
    const others = await Promise.all([7, 8, 9].map(async (s) => (await split(s)).join()));
    expect(others.some((o) => o !== first.join())).toBe(true);
    // "unassigned" leaves documents that already have a split alone.
    const [doc] = await listAll("split=train");
    await manager.agent.post(`${docsPath()}/split`).send({ documentIds: (await listAll("split=test")).map((d) => d.id).concat(doc!.id), split: null });
    const res = await manager.agent.post(`${docsPath()}/split`).send({ testPercent: 50, seed: 3, scope: "unassigned" });
    expect(res.body.train + res.body.test).toBe(4);
    expect(await listAll("split=none")).toHaveLength(0);
  });
});

describe("deleting", () => {
  it("deletes a document for good and logs it", async () => {
    const [victim] = await listAll("q=meadow");
    expect((await annotator.agent.delete(`${docsPath()}/${victim!.id}`)).status).toBe(403);
    expect((await manager.agent.delete(`${docsPath()}/${victim!.id}`)).status).toBe(204);
    expect((await manager.agent.get(`${docsPath()}/${victim!.id}`)).status).toBe(404);
    const audit = await admin.agent.get(`/api/orgs/${admin.orgId}/audit?action=document.deleted`);
    expect(audit.body.items[0]).toMatchObject({ targetId: victim!.id, targetLabel: "meadow" });
  });

  it("asks before deleting a type with spans, then removes them from gold, suggestions and registered stores", async () => {
    const removedFrom: string[] = [];
    registerEntityTypeSpanStore({
      name: "test-store",
      count: async () => ({ spans: 2, documents: 1 }),
      remove: async (_org, typeId) => {
        removedFrom.push(typeId);
      },
    });
    // A suggestion of PLACE as well as the 12 gold PLACE spans.
    await uploadAndWait(
      manager.agent,
      admin.orgId,
      corpusId,
      [{ name: "hint.jsonl", content: JSON.stringify({ text: "Lowmere again.", spans: [{ start: 0, end: 7, type: "PLACE" }] }) }],
      { spanMode: "suggested" },
    );
    const typePath = `/api/orgs/${admin.orgId}/corpora/${corpusId}/entity-types/${typeIds.PLACE}`;
    const usage = await manager.agent.get(`${typePath}/usage`);
    // Other features (assignments) register their own stores; here they hold none of these spans.
    expect(usage.body).toMatchObject({ spanCount: 15, documentCount: 12, byStore: { gold: 12, suggestions: 1, "test-store": 2 } });
    const ask = await manager.agent.delete(typePath).send({});
    expect(ask.status).toBe(409);
    expect(ask.body.error.code).toBe("entity_type_in_use");
    expect(ask.body.error.message).toBe("PLACE has 15 spans in 12 documents. Deleting it removes them.");
    expect(removedFrom).toEqual([]);

    expect((await manager.agent.delete(typePath).send({ confirm: true })).status).toBe(204);
    expect(removedFrom).toEqual([typeIds.PLACE]);
    const gold = await listAll("status=gold");
    for (const d of gold) {
      const doc = (await reader.agent.get(`${docsPath()}/${d.id}`)).body as DocumentDetail;
      expect(doc.gold.map((s) => s.type)).toEqual(["PARTY"]);
    }
    const [hint] = await listAll("q=again");
    expect((await reader.agent.get(`${docsPath()}/${hint!.id}`)).body.suggestions).toEqual([]);
  });

  it("renaming a type keeps its spans", async () => {
    await manager.agent.patch(`/api/orgs/${admin.orgId}/corpora/${corpusId}/entity-types/${typeIds.PARTY}`).send({ name: "PERSON" });
    const [d] = await listAll("q=otter");
    expect((await reader.agent.get(`${docsPath()}/${d!.id}`)).body.gold).toEqual([{ start: 0, end: 15, type: "PERSON" }]);
  });
});
