import type { DocumentDetail, DocumentListItem } from "@tagloom/contracts";
import { beforeAll, describe, expect, it } from "vitest";
import { createCorpusWithTypes, uploadAndWait } from "./support/corpora";
import { type SignedIn, type TestServer, addSignedInMember, signUpFounder, startTestServer } from "./support/http";
import { startTestWorkers } from "./support/workers";

let server: TestServer;
let admin: SignedIn;
let manager: SignedIn;
let dataLead: SignedIn;
let annotator: SignedIn;
const types = ["PARTY", "PLACE", "MONEY"];

beforeAll(async () => {
  server = await startTestServer();
  await startTestWorkers();
  admin = await signUpFounder(server, { organizationName: "Export Org" });
  manager = await addSignedInMember(server, admin.orgId, "manager");
  dataLead = await addSignedInMember(server, admin.orgId, "data_lead");
  annotator = await addSignedInMember(server, admin.orgId, "annotator");
});

// Varied documents: several sentences, spans next to punctuation, accents, emoji, CJK, RTL.
const source = [
  {
    title: "Loan",
    split: "train",
    text: "Quillmark Ltd. lent Ada Brightwater €4,000 in Lowmere. She repaid it in March!\n\nThe board agreed.",
    spans: [
      { start: 0, end: 14, type: "PARTY" },
      { start: 20, end: 35, type: "PARTY" },
      { start: 36, end: 42, type: "MONEY" },
      { start: 46, end: 53, type: "PLACE" },
    ],
  },
  { title: "Café", split: "test", text: "José Ñandú opened Café Élun in Pellavine-sur-Brume 🙂.", spans: [{ start: 0, end: 10, type: "PARTY" }, { start: 31, end: 50, type: "PLACE" }] },
  { title: "霧港", text: "ミラクエは霧港の会社で働いています。", spans: [{ start: 0, end: 4, type: "PARTY" }] },
  { title: "RTL", split: "train", text: "سافرت ليلى إلى مدينة القمر أمس.", spans: [{ start: 6, end: 10, type: "PARTY" }] },
  { title: "Nothing", split: "test", text: "No entities at all here.", spans: [] },
];

async function corpusDocs(agent: SignedIn["agent"], orgId: string, corpusId: string): Promise<DocumentDetail[]> {
  const list = await agent.get(`/api/orgs/${orgId}/corpora/${corpusId}/documents?limit=200&sort=created&dir=asc`);
  const details = await Promise.all(
    (list.body.items as DocumentListItem[]).map((d) => agent.get(`/api/orgs/${orgId}/corpora/${corpusId}/documents/${d.id}`)),
  );
  return details.map((r) => r.body as DocumentDetail).sort((a, b) => a.text.localeCompare(b.text));
}

const exportOf = (agent: SignedIn["agent"], orgId: string, corpusId: string, query: string) =>
  agent.get(`/api/orgs/${orgId}/corpora/${corpusId}/exports?${query}`).buffer(true).parse((res, cb) => {
    let data = "";
    res.setEncoding("utf8");
    res.on("data", (c: string) => (data += c));
    res.on("end", () => cb(null, data));
  });

describe("export and import round-trip", () => {
  let corpusId: string;

  beforeAll(async () => {
    ({ corpusId } = await createCorpusWithTypes(manager.agent, admin.orgId, "Round trip", types));
    const lines = source.map((d) => JSON.stringify(d)).join("\n");
    await uploadAndWait(manager.agent, admin.orgId, corpusId, [
      { name: "source.jsonl", content: lines },
      // Not gold: left out of every export.
      { name: "plain.txt", content: "Unannotated text stays out of exports." },
    ]);
  });

  it("JSONL: exports gold documents in the import shape and re-imports to the same text and spans", async () => {
    const res = await exportOf(dataLead.agent, admin.orgId, corpusId, "format=jsonl&split=all");
    expect(res.status).toBe(200);
    expect(res.headers["content-type"]).toMatch(/application\/x-ndjson/);
    expect(res.headers["content-disposition"]).toBe('attachment; filename="round-trip-all-gold.jsonl"');
    const lines = (res.body as string).trimEnd().split("\n").map((l) => JSON.parse(l));
    expect(lines).toHaveLength(5);
    expect(lines[0]).toEqual({ title: "Loan", text: source[0]!.text, split: "train", spans: source[0]!.spans });

    const { corpusId: again } = await createCorpusWithTypes(manager.agent, admin.orgId, "Round trip again", types);
    const { byName } = await uploadAndWait(manager.agent, admin.orgId, again, [{ name: "export.jsonl", content: res.body as string }]);
    expect(byName["export.jsonl"]).toMatchObject({ state: "ready", documentsCreated: 5 });
    const before = (await corpusDocs(manager.agent, admin.orgId, corpusId)).filter((d) => d.annotationStatus === "gold");
    const after = await corpusDocs(manager.agent, admin.orgId, again);
    expect(after.map((d) => [d.title, d.text, d.split, d.gold])).toEqual(before.map((d) => [d.title, d.text, d.split, d.gold]));
  });

  it("exports one split only", async () => {
    const train = await exportOf(dataLead.agent, admin.orgId, corpusId, "format=jsonl&split=train");
    expect((train.body as string).trimEnd().split("\n").map((l) => JSON.parse(l).title)).toEqual(["Loan", "RTL"]);
    const test = await exportOf(dataLead.agent, admin.orgId, corpusId, "format=jsonl&split=test");
    expect((test.body as string).trimEnd().split("\n").map((l) => JSON.parse(l).title)).toEqual(["Café", "Nothing"]);
  });

  it("CoNLL: exports IOB2 with -DOCSTART- between documents and blank lines between sentences", async () => {
    const res = await exportOf(manager.agent, admin.orgId, corpusId, "format=conll&split=train");
    expect(res.headers["content-disposition"]).toBe('attachment; filename="round-trip-train-gold.conll"');
    const text = res.body as string;
    const documents = text.split("-DOCSTART-\n\n");
    expect(documents).toEqual(["", expect.any(String), expect.any(String)]);
    const [loan, rtl] = [documents[1]!, documents[2]!];
    // Tokens as the tokenizer stored them, one per line with its IOB2 tag; a blank line ends a sentence.
    expect(loan).toContain("Quillmark\tB-PARTY\n");
    expect(loan).toContain("lent\tO\nAda\tB-PARTY\nBrightwater\tI-PARTY\n");
    expect(loan).toContain("in\tO\nLowmere\tB-PLACE\n.\tO\n\nShe\tO\n");
    expect(loan.endsWith("agreed\tO\n.\tO\n\n")).toBe(true);
    expect(rtl).toContain("ليلى\tB-PARTY\n");
    for (const line of text.split("\n")) expect(line).toMatch(/^$|^-DOCSTART-$|^\S+\t(O|[BI]-(PARTY|PLACE|MONEY))$/);
  });

  it("CoNLL: import, export and import again give the same text and spans", async () => {
    const conll = ["-DOCSTART- -X- O", "", "Ada B-PARTY", "Brightwater I-PARTY", "paid O", "€40 B-MONEY", ". O", "", "Lowmere B-PLACE", "thanked O", "her O", ". O", "", "-DOCSTART- -X- O", "", "Quillmark I-PARTY", "Ltd. I-PARTY", "closed O", ""].join("\n");
    const { corpusId: first } = await createCorpusWithTypes(manager.agent, admin.orgId, "Columns first", types);
    await uploadAndWait(manager.agent, admin.orgId, first, [{ name: "in.conll", content: conll }]);
    const exported = await exportOf(manager.agent, admin.orgId, first, "format=conll");
    // IOB1 "I-PARTY" at the start of a chunk comes back as IOB2 "B-PARTY".
    expect(exported.body as string).toContain("Quillmark\tB-PARTY\nLtd.\tI-PARTY\n");
    const { corpusId: second } = await createCorpusWithTypes(manager.agent, admin.orgId, "Columns second", types);
    await uploadAndWait(manager.agent, admin.orgId, second, [{ name: "in.conll", content: exported.body as string }]);
    const a = await corpusDocs(manager.agent, admin.orgId, first);
    const b = await corpusDocs(manager.agent, admin.orgId, second);
    expect(b.map((d) => [d.text, d.gold, d.tokens])).toEqual(a.map((d) => [d.text, d.gold, d.tokens]));
    expect(a[0]!.text).toBe("Ada Brightwater paid €40 .\nLowmere thanked her .");
  });

  it("lets data leads, managers and admins export; not annotators; and refuses a bad format", async () => {
    expect((await annotator.agent.get(`/api/orgs/${admin.orgId}/corpora/${corpusId}/exports?format=jsonl`)).status).toBe(403);
    expect((await dataLead.agent.get(`/api/orgs/${admin.orgId}/corpora/${corpusId}/exports?format=xml`)).status).toBe(400);
    const audit = await admin.agent.get(`/api/orgs/${admin.orgId}/audit?action=corpus.exported`);
    expect(audit.body.items.length).toBeGreaterThanOrEqual(4);
  });

  it("exports in upload order: file by file as uploaded, line by line within a file", async () => {
    const { corpusId: ordered } = await createCorpusWithTypes(manager.agent, admin.orgId, "Ordered export", types);
    const file = (titles: string[]) => titles.map((title) => JSON.stringify({ title, text: `${title} text.`, spans: [] })).join("\n");
    await uploadAndWait(manager.agent, admin.orgId, ordered, [
      { name: "first.jsonl", content: file(["a1", "a2", "a3"]) },
      { name: "second.jsonl", content: file(["b1", "b2"]) },
      { name: "third.jsonl", content: file(["c1"]) },
    ]);
    const res = await exportOf(manager.agent, admin.orgId, ordered, "format=jsonl");
    expect((res.body as string).trimEnd().split("\n").map((l) => JSON.parse(l).title)).toEqual(["a1", "a2", "a3", "b1", "b2", "c1"]);
  });

  it("exports an empty file for a corpus with no gold documents", async () => {
    const { corpusId: empty } = await createCorpusWithTypes(manager.agent, admin.orgId, "Empty export", types);
    const res = await exportOf(manager.agent, admin.orgId, empty, "format=conll");
    expect(res.status).toBe(200);
    expect(res.body).toBe("");
  });
});
