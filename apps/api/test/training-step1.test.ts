import { DEFAULT_TRAINING_CONFIG, loadModel, serializeModel, trainTagger } from "@tagloom/tagger";
import { trainingConfigDefaults } from "@tagloom/contracts";
import { beforeAll, describe, expect, it } from "vitest";
import { createCorpus } from "@/corpora/corpora.service";
import { createEntityType, deleteEntityType } from "@/corpora/entity-types.service";
import { db } from "@/db/knex";
import { insertDocuments } from "@/documents/documents.repository";
import { saveGoldSpans } from "@/documents/documents.service";
import { getTagger, getTaggerModelText, insertTagger, listTaggers } from "@/training/taggers.service";
import { type SignedIn, type TestServer, signUpFounder, startTestServer } from "./support/http";

// Tables and service functions other features build on: gold versions, and taggers stored byte
// for byte with a version per corpus.
let server: TestServer;
let founder: SignedIn;
let other: SignedIn;
let corpusId: string;
let documentId: string;
const text = "Wren Odalsby joined Brackenfold Ltd today.";

beforeAll(async () => {
  server = await startTestServer();
  founder = await signUpFounder(server, { organizationName: "Taggers Org" });
  other = await signUpFounder(server, { organizationName: "Other Taggers Org" });
  const actor = { userId: founder.userId, email: founder.email };
  corpusId = (await createCorpus(founder.orgId, { name: "Filings" }, actor)).id;
  await createEntityType(founder.orgId, corpusId, { name: "PERSON" }, actor);
  await createEntityType(founder.orgId, corpusId, { name: "ORG" }, actor);
  const [id] = await insertDocuments(
    [
      {
        organizationId: founder.orgId,
        corpusId,
        uploadFileId: null,
        sourceIndex: 0,
        title: "Joining",
        text,
        contentHash: "x",
        split: "train",
        annotationStatus: "none",
        tokens: { starts: [0, 5, 13, 20, 31, 35, 41], ends: [4, 12, 19, 30, 34, 40, 42], sentenceStarts: [0] },
      },
    ],
    db,
  );
  documentId = id!;
});

describe("training defaults", () => {
  it("mirror the engine's DEFAULT_TRAINING_CONFIG field for field", () => {
    const engine = DEFAULT_TRAINING_CONFIG;
    const { crossValidationFolds: _k, testSplit: _t, perceptronFeatures, ...mirrored } = trainingConfigDefaults;
    const fromEngine = Object.fromEntries(Object.keys(mirrored).map((k) => [k, engine[k as keyof typeof engine]]));
    expect(mirrored).toEqual(fromEngine);
    // On purpose (contracts/src/training.ts): a run's perceptron is over neighbour features, the engine's default over symbols.
    expect([perceptronFeatures, engine.perceptronFeatures]).toEqual(["neighbours", "symbol"]);
  });
});

describe("gold versions", () => {
  it("start at 1 and go up with every write of gold, including removing a type's spans", async () => {
    const version = async () => (await db("document_gold").where({ document_id: documentId }).first("version"))?.version;
    await saveGoldSpans(founder.orgId, documentId, [{ start: 0, end: 12, type: "PERSON" }], "review", founder.userId);
    expect(await version()).toBe(1);
    await saveGoldSpans(founder.orgId, documentId, [{ start: 0, end: 12, type: "PERSON" }, { start: 20, end: 34, type: "ORG" }], "review", founder.userId);
    expect(await version()).toBe(2);
    const org = (await db("entity_types").where({ corpus_id: corpusId, name: "ORG" }).first("id")).id as string;
    await deleteEntityType(founder.orgId, corpusId, org, true, { userId: founder.userId, email: founder.email });
    expect(await version()).toBe(3);
  });
});

describe("taggers service", () => {
  it("stores the model text byte for byte, numbers versions per corpus and hides other organizations'", async () => {
    const sentences = [{ words: ["Wren", "Odalsby", "joined", "Brackenfold", "Ltd", "today", "."], tags: ["B-PERSON", "I-PERSON", "O", "B-ORG", "I-ORG", "O", "O"] }];
    const modelText = JSON.stringify(serializeModel(trainTagger([{ sentences }]).model));
    const first = await insertTagger({ organizationId: founder.orgId, corpusId, modelText });
    const second = await insertTagger({ organizationId: founder.orgId, corpusId, modelText: modelText + "\n" });
    expect([first.version, second.version]).toEqual([1, 2]);
    expect(first.label).toBe("Tagger v1 of Filings");
    expect(await getTaggerModelText(founder.orgId, corpusId, first.id)).toBe(modelText);
    expect(loadModel(JSON.parse(await getTaggerModelText(founder.orgId, corpusId, first.id))).tags).toContain("B-PERSON");
    expect((await getTagger(founder.orgId, corpusId, second.id)).version).toBe(2);
    const page = await listTaggers(founder.orgId, corpusId, { limit: 1 });
    expect(page.items.map((t) => t.version)).toEqual([2]);
    const rest = await listTaggers(founder.orgId, corpusId, { limit: 1, cursor: page.nextCursor! });
    expect([rest.items.map((t) => t.version), rest.nextCursor]).toEqual([[1], null]);
    await expect(getTagger(other.orgId, corpusId, first.id)).rejects.toMatchObject({ status: 404 });
    await expect(getTaggerModelText(other.orgId, corpusId, first.id)).rejects.toMatchObject({ status: 404 });
    await expect(getTagger(founder.orgId, corpusId, "nope")).rejects.toMatchObject({ status: 404 });
  });
});
