import { beforeAll, describe, expect, it } from "vitest";
import { createCorpusWithTypes } from "./support/corpora";
import { type SignedIn, type TestServer, addSignedInMember, signUpFounder, startTestServer } from "./support/http";

let server: TestServer;
let admin: SignedIn;
let manager: SignedIn;
let annotator: SignedIn;

beforeAll(async () => {
  server = await startTestServer();
  admin = await signUpFounder(server, { organizationName: "Corpus Org" });
  manager = await addSignedInMember(server, admin.orgId, "manager");
  annotator = await addSignedInMember(server, admin.orgId, "annotator");
});

const base = () => `/api/orgs/${admin.orgId}/corpora`;

async function auditActions(): Promise<string[]> {
  const res = await admin.agent.get(`/api/orgs/${admin.orgId}/audit?limit=200`);
  return res.body.items.map((e: { action: string }) => e.action);
}

describe("corpora", () => {
  it("a manager creates, lists, renames, describes, archives and unarchives a corpus", async () => {
    const created = await manager.agent.post(base()).send({ name: "  Incident reports ", description: "Night shift" });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ name: "Incident reports", description: "Night shift", archivedAt: null });
    const id = created.body.id;

    const list = await annotator.agent.get(base());
    expect(list.status).toBe(200);
    expect(list.body.items.map((c: { name: string }) => c.name)).toContain("Incident reports");

    const renamed = await manager.agent.patch(`${base()}/${id}`).send({ name: "Incident notes", description: "Both shifts" });
    expect(renamed.body).toMatchObject({ name: "Incident notes", description: "Both shifts" });

    const archived = await manager.agent.patch(`${base()}/${id}`).send({ archived: true });
    expect(archived.body.archivedAt).not.toBeNull();
    expect((await manager.agent.get(base())).body.items.map((c: { id: string }) => c.id)).not.toContain(id);
    expect((await manager.agent.get(`${base()}?archived=true`)).body.items.map((c: { id: string }) => c.id)).toContain(id);

    // An archived corpus takes no changes to its schema until it is unarchived.
    const blocked = await manager.agent.post(`${base()}/${id}/entity-types`).send({ name: "PARTY" });
    expect(blocked.status).toBe(409);
    expect(blocked.body.error.code).toBe("corpus_archived");
    expect((await manager.agent.patch(`${base()}/${id}`).send({ archived: false })).body.archivedAt).toBeNull();

    const actions = await auditActions();
    for (const a of ["corpus.created", "corpus.renamed", "corpus.described", "corpus.archived", "corpus.unarchived"]) expect(actions).toContain(a);
  });

  it("refuses a duplicate name (any case), an empty name and an empty change", async () => {
    await manager.agent.post(base()).send({ name: "Court rulings" });
    const dup = await manager.agent.post(base()).send({ name: "COURT RULINGS" });
    expect(dup.status).toBe(409);
    expect(dup.body.error.code).toBe("name_taken");
    const empty = await manager.agent.post(base()).send({ name: "   " });
    expect(empty.status).toBe(400);
    expect(empty.body.error.details.fields.name).toBeDefined();
    const list = await manager.agent.get(base());
    const id = list.body.items.find((c: { name: string }) => c.name === "Court rulings").id;
    expect((await manager.agent.patch(`${base()}/${id}`).send({})).status).toBe(400);
  });

  it("pages through corpora with a cursor", async () => {
    for (let i = 0; i < 5; i++) await manager.agent.post(base()).send({ name: `Paged ${i}` });
    const seen: string[] = [];
    let cursor: string | null = null;
    do {
      const res: { body: { items: Array<{ id: string }>; nextCursor: string | null } } = await manager.agent.get(`${base()}?limit=2${cursor ? `&cursor=${cursor}` : ""}`);
      seen.push(...res.body.items.map((c) => c.id));
      cursor = res.body.nextCursor;
    } while (cursor);
    expect(new Set(seen).size).toBe(seen.length);
    expect(seen.length).toBeGreaterThanOrEqual(5);
    expect((await manager.agent.get(`${base()}?cursor=garbage`)).status).toBe(400);
  });

  it("deletes a corpus for good only when its name is typed exactly, and logs it", async () => {
    const { corpusId } = await createCorpusWithTypes(manager.agent, admin.orgId, "Scratch corpus", ["PARTY"]);
    const wrong = await manager.agent.delete(`${base()}/${corpusId}`).send({ confirmName: "scratch corpus" });
    expect(wrong.status).toBe(400);
    expect((await manager.agent.get(`${base()}/${corpusId}`)).status).toBe(200);
    const ok = await manager.agent.delete(`${base()}/${corpusId}`).send({ confirmName: "Scratch corpus" });
    expect(ok.status).toBe(204);
    expect((await manager.agent.get(`${base()}/${corpusId}`)).status).toBe(404);
    expect((await manager.agent.get(`${base()}/${corpusId}/entity-types`)).status).toBe(404);
    expect(await auditActions()).toContain("corpus.deleted");
  });

  it("answers 404 for an unknown or malformed corpus id", async () => {
    expect((await manager.agent.get(`${base()}/00000000-0000-4000-8000-000000000000`)).status).toBe(404);
    expect((await manager.agent.get(`${base()}/not-an-id`)).status).toBe(404);
  });
});

describe("entity types", () => {
  let corpusId: string;
  const types = () => `${base()}/${corpusId}/entity-types`;

  beforeAll(async () => {
    ({ corpusId } = await createCorpusWithTypes(manager.agent, admin.orgId, "Schema corpus"));
  });

  it("gives new types the Okabe–Ito colours in order and keeps schema order", async () => {
    // Okabe & Ito (2008), "Color Universal Design", the palette's orange, sky blue, bluish green.
    for (const name of ["PARTY", "PLACE", "DATE"]) expect((await manager.agent.post(types()).send({ name })).status).toBe(201);
    const list = await annotator.agent.get(types());
    expect(list.body.items.map((t: { name: string; color: string; position: number }) => [t.name, t.color, t.position])).toEqual([
      ["PARTY", "#E69F00", 0],
      ["PLACE", "#56B4E9", 1],
      ["DATE", "#009E73", 2],
    ]);
  });

  it("validates names, colours and hotkeys and keeps hotkeys unique in the corpus", async () => {
    const bad = await manager.agent.post(types()).send({ name: "party", color: "red", hotkey: "ab" });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.details.fields).sort()).toEqual(["color", "hotkey", "name"]);
    expect((await manager.agent.post(types()).send({ name: "AMOUNT", hotkey: "M", color: "#cc79a7", guideline: "Sums of **money**." })).body).toMatchObject({
      hotkey: "m",
      color: "#CC79A7",
      guideline: "Sums of **money**.",
    });
    const taken = await manager.agent.post(types()).send({ name: "ROLE", hotkey: "m" });
    expect(taken.status).toBe(409);
    expect(taken.body.error.code).toBe("hotkey_taken");
    const dupName = await manager.agent.post(types()).send({ name: "PARTY" });
    expect(dupName.body.error.code).toBe("name_taken");
  });

  it("renames a type, changes its guideline and reorders it", async () => {
    const list = (await manager.agent.get(types())).body.items;
    const place = list.find((t: { name: string }) => t.name === "PLACE");
    const res = await manager.agent.patch(`${types()}/${place.id}`).send({ name: "LOCATION", guideline: "Towns, rivers.", position: 9 });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ id: place.id, name: "LOCATION", guideline: "Towns, rivers.", position: 9 });
    const after = (await manager.agent.get(types())).body.items.map((t: { name: string }) => t.name);
    expect(after[after.length - 1]).toBe("LOCATION");
    expect(await auditActions()).toContain("entity_type.renamed");
  });

  it("deletes a type without spans at once; only managers and admins change the schema", async () => {
    const created = await manager.agent.post(types()).send({ name: "TEMP" });
    expect((await annotator.agent.delete(`${types()}/${created.body.id}`).send({})).status).toBe(403);
    expect((await annotator.agent.post(types()).send({ name: "NOPE" })).status).toBe(403);
    expect((await manager.agent.delete(`${types()}/${created.body.id}`).send({})).status).toBe(204);
    expect((await manager.agent.delete(`${types()}/${created.body.id}`).send({})).status).toBe(404);
  });
});
