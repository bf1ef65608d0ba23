import { tokenizeText } from "@tagloom/tagger";
import { beforeAll, describe, expect, it } from "vitest";
import { createCorpus, getCorpus, listEntityTypes } from "@/corpora/corpora.service";
import { createEntityType } from "@/corpora/entity-types.service";
import { db } from "@/db/knex";
import { insertDocuments } from "@/documents/documents.repository";
import {
  getDocumentForAnnotation,
  getDocumentSummaries,
  getGoldSpans,
  getSuggestions,
  saveGoldSpans,
  setAnnotationStatus,
} from "@/documents/documents.service";
import { type SignedIn, type TestServer, signUpFounder, startTestServer } from "./support/http";

// The services issue 6 (batches, assignments, review) builds on, called directly.
let server: TestServer;
let founder: SignedIn;
let other: SignedIn;
let corpusId: string;
let documentId: string;
const text = "Ada Brightwater met the Quillmark board in Lowmere. She signed.";

beforeAll(async () => {
  server = await startTestServer();
  founder = await signUpFounder(server, { organizationName: "Services Org" });
  other = await signUpFounder(server, { organizationName: "Elsewhere Org" });
  const actor = { userId: founder.userId, email: founder.email };
  corpusId = (await createCorpus(founder.orgId, { name: "Contracts" }, actor)).id;
  const person = await createEntityType(founder.orgId, corpusId, { name: "PERSON", hotkey: "p" }, actor);
  await createEntityType(founder.orgId, corpusId, { name: "ORG" }, actor);
  const { tokens, sentences } = tokenizeText(text);
  const [id] = await insertDocuments(
    [
      {
        organizationId: founder.orgId,
        corpusId,
        uploadFileId: null,
        sourceIndex: 0,
        title: "Board meeting",
        text,
        contentHash: "x",
        split: "train",
        annotationStatus: "none",
        tokens: { starts: tokens.map((t) => t.start), ends: tokens.map((t) => t.end), sentenceStarts: sentences.map((s) => s.start) },
        suggestions: [{ start: 0, end: 16, typeId: person.id, confidence: 0.75 }],
      },
    ],
    db,
  );
  documentId = id!;
});

describe("corpus services", () => {
  it("getCorpus finds the organization's corpus and hides others'", async () => {
    expect((await getCorpus(founder.orgId, corpusId)).name).toBe("Contracts");
    await expect(getCorpus(other.orgId, corpusId)).rejects.toMatchObject({ status: 404 });
    await expect(getCorpus(founder.orgId, "not-a-uuid")).rejects.toMatchObject({ status: 404 });
  });

  it("listEntityTypes gives the schema in order with Okabe–Ito default colours", async () => {
    const types = await listEntityTypes(founder.orgId, corpusId);
    expect(types.map((t) => [t.name, t.color, t.hotkey, t.position])).toEqual([
      ["PERSON", "#E69F00", "p", 0],
      ["ORG", "#56B4E9", null, 1],
    ]);
    await expect(listEntityTypes(other.orgId, corpusId)).rejects.toMatchObject({ status: 404 });
  });
});

describe("document services", () => {
  it("getDocumentForAnnotation returns text and tokens whose offsets slice the text", async () => {
    const doc = await getDocumentForAnnotation(founder.orgId, documentId);
    expect(doc).toMatchObject({ id: documentId, corpusId, title: "Board meeting", text, split: "train" });
    const words = doc.tokens.starts.map((s, i) => doc.text.slice(s, doc.tokens.ends[i]));
    expect(words.slice(0, 4)).toEqual(["Ada", "Brightwater", "met", "the"]);
    expect(doc.tokens.sentenceStarts).toEqual([0, words.indexOf("She")]);
    await expect(getDocumentForAnnotation(other.orgId, documentId)).rejects.toMatchObject({ status: 404 });
  });

  it("getDocumentSummaries keeps the order of the ids and leaves out others' and unknown ids", async () => {
    const summaries = await getDocumentSummaries(founder.orgId, [documentId, "00000000-0000-4000-8000-000000000000", "junk"]);
    expect(summaries).toEqual([{ id: documentId, corpusId, title: "Board meeting", tokenCount: 12, split: "train", annotationStatus: "none" }]);
    expect(await getDocumentSummaries(other.orgId, [documentId])).toEqual([]);
  });

  it("setAnnotationStatus changes only the organization's documents", async () => {
    await setAnnotationStatus(other.orgId, [documentId], "submitted");
    expect((await getDocumentSummaries(founder.orgId, [documentId]))[0]!.annotationStatus).toBe("none");
    await setAnnotationStatus(founder.orgId, [documentId], "in_progress");
    expect((await getDocumentSummaries(founder.orgId, [documentId]))[0]!.annotationStatus).toBe("in_progress");
  });

  it("getSuggestions maps type ids to names with the confidence", async () => {
    expect(await getSuggestions(founder.orgId, documentId)).toEqual([{ start: 0, end: 16, type: "PERSON", confidence: 0.75 }]);
  });

  it("saveGoldSpans refuses bad spans, saves good ones and marks the document gold", async () => {
    await expect(
      saveGoldSpans(founder.orgId, documentId, [
        { start: 0, end: 16, type: "PERSON" },
        { start: 10, end: 20, type: "ORG" },
        { start: 60, end: 90, type: "ORG" },
        { start: 24, end: 33, type: "PLACE" },
      ], "review", founder.userId),
    ).rejects.toMatchObject({ status: 400 });
    expect(await getGoldSpans(founder.orgId, documentId)).toEqual([]);

    await saveGoldSpans(founder.orgId, documentId, [
      { start: 24, end: 33, type: "ORG" },
      { start: 0, end: 16, type: "PERSON" },
    ], "review", founder.userId);
    expect(await getGoldSpans(founder.orgId, documentId)).toEqual([
      { start: 0, end: 16, type: "PERSON" },
      { start: 24, end: 33, type: "ORG" },
    ]);
    expect((await getDocumentSummaries(founder.orgId, [documentId]))[0]!.annotationStatus).toBe("gold");
    await expect(getGoldSpans(other.orgId, documentId)).rejects.toMatchObject({ status: 404 });
  });
});
