import { execFileSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { tagsToChunks, tokenizeText } from "@tagloom/tagger";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { type TestServer, addSignedInMember, signUpFounder, startTestServer } from "./support/http";
import { createAnnotationData } from "./support/annotation-data";
import { labelledDocuments, trainTestModel } from "./support/tagging-data";
import { createTestTagger } from "./support/taggers";

let server: TestServer;
let limited: TestServer;
let work: string;
beforeAll(async () => {
  server = await startTestServer();
  limited = await startTestServer({ authRateLimit: 10_000, taggingRateLimit: { points: 3, windowSeconds: 60 } });
  work = mkdtempSync(path.join(tmpdir(), "tagging-api-"));
});
afterAll(() => rmSync(work, { recursive: true, force: true }));

const repoRoot = path.resolve(import.meta.dirname, "../../..");
const tsx = path.join(repoRoot, "apps/api/node_modules/.bin/tsx");

/**
 * Outside check of the served model: the tagger's own command line (`tagger tag`, a separate
 * process reading the downloaded JSON) tags the same tokens; its IOB2 column output is read
 * back into chunks with the CoNLL convention and mapped to character offsets.
 */
function cliSpans(modelJson: string, text: string): Array<{ start: number; end: number; type: string; text: string }> {
  const { tokens, sentences } = tokenizeText(text);
  const modelFile = path.join(work, `model-${Math.random().toString(36).slice(2)}.json`);
  const inputFile = `${modelFile}.tokens`;
  writeFileSync(modelFile, modelJson);
  writeFileSync(inputFile, sentences.map((s) => tokens.slice(s.start, s.end).map((t) => `${text.slice(t.start, t.end)}\n`).join("")).join("\n"));
  const out = execFileSync(tsx, [path.join(repoRoot, "packages/tagger/src/cli.ts"), "tag", "--model", modelFile, "--input", inputFile], { encoding: "utf8" });
  const blocks = out.split("\n\n").map((b) => b.split("\n").filter(Boolean));
  const spans: Array<{ start: number; end: number; type: string; text: string }> = [];
  sentences.forEach((s, i) => {
    const lines = blocks[i]!;
    expect(lines.map((l) => l.split("\t")[0])).toEqual(tokens.slice(s.start, s.end).map((t) => text.slice(t.start, t.end)));
    for (const c of tagsToChunks(lines.map((l) => l.split("\t")[1]!))) {
      const start = tokens[s.start + c.start]!.start;
      const end = tokens[s.start + c.end - 1]!.end;
      spans.push({ start, end, type: c.type, text: text.slice(start, end) });
    }
  });
  return spans;
}

async function setUp(app: TestServer, orgName: string) {
  const admin = await signUpFounder(app, { organizationName: orgName });
  const lead = await addSignedInMember(app, admin.orgId, "data_lead");
  const data = await createAnnotationData(admin.orgId, admin, { types: [{ name: "PARTY" }, { name: "PLACE" }], documents: [{ title: "Empty", text: "Nothing here." }] });
  const trained = trainTestModel(labelledDocuments(30));
  const tagger = await createTestTagger(admin.orgId, data.corpusId, trained.json, admin.userId);
  const token = (await lead.agent.post(`/api/orgs/${admin.orgId}/tokens`).send({ name: "pipeline" })).body.token as string;
  return { admin, lead, corpusId: data.corpusId, tagger, trained, token };
}

describe("POST /api/v1/corpora/:corpusId/tag", () => {
  it("answers the corpus suggester's spans, equal to the CLI's tags, with exact UTF-16 offsets", async () => {
    const s = await setUp(server, "Wrenfold Notes");
    const url = `/api/v1/corpora/${s.corpusId}/tag`;
    // No suggester yet: 409 that says what to do.
    const none = await request(server.url).post(url).set("Authorization", `Bearer ${s.token}`).send({ text: "Mira Quell met Tobin Vale." });
    expect(none.status).toBe(409);
    expect(none.body.error.code).toBe("no_suggester");
    expect(none.body.error.message).toMatch(/suggester/);

    expect((await s.lead.agent.put(`/api/orgs/${s.admin.orgId}/corpora/${s.corpusId}/suggester`).send({ taggerId: s.tagger.id })).status).toBe(200);

    const texts = [
      "On day 3 Zoë Brünnhilde met Élodie Varga in Ørsvik.",
      "🚀 On day 9 Mira Quell 👩‍🔬 thanked Tobin Vale in Saltmarsh. 🎉 Then Orla Finch called Edda Rusk in Larkspur Quay.",
      "On day 4 山田花子 visited Jory Marrow in 青葉港.",
      "",
    ];
    const res = await request(server.url).post(url).set("Authorization", `Bearer ${s.token}`).send({ texts });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(Object.keys(res.body).sort()).toEqual(["results", "tagger"]);
    expect(res.body.tagger).toEqual({ id: s.tagger.id, version: s.tagger.version });
    expect(res.body.results).toHaveLength(texts.length);
    texts.forEach((text, i) => {
      const spans = res.body.results[i].spans as Array<{ start: number; end: number; type: string; text: string; confidence: number }>;
      for (const span of spans) {
        expect(Object.keys(span).sort()).toEqual(["confidence", "end", "start", "text", "type"]);
        expect(span.text).toBe(text.slice(span.start, span.end));
        expect(span.confidence).toBeGreaterThan(0);
        expect(span.confidence).toBeLessThanOrEqual(1);
      }
      expect(spans.map(({ confidence: _c, ...rest }) => rest)).toEqual(text ? cliSpans(s.trained.json, text) : []);
    });
    // Exact offsets of names around accents, emoji (surrogate pairs and a ZWJ sequence) and CJK.
    const offsets = (i: number) => res.body.results[i].spans.map((x: { start: number; end: number; type: string }) => [x.start, x.end, x.type]);
    const at = (t: string, phrase: string, type: string) => [t.indexOf(phrase), t.indexOf(phrase) + phrase.length, type];
    expect(offsets(0)).toEqual([at(texts[0]!, "Zoë Brünnhilde", "PARTY"), at(texts[0]!, "Élodie Varga", "PARTY"), at(texts[0]!, "Ørsvik", "PLACE")]);
    expect(offsets(1)).toContainEqual(at(texts[1]!, "Tobin Vale", "PARTY"));
    expect(offsets(1)).toContainEqual(at(texts[1]!, "Larkspur Quay", "PLACE"));
    // 🚀 and 🔬 are two UTF-16 units each, the zero-width joiner one: "Tobin Vale" starts at unit 37.
    expect(offsets(1)).toContainEqual([37, 47, "PARTY"]);
    expect(offsets(2)).toContainEqual(at(texts[2]!, "Jory Marrow", "PARTY"));
    expect(offsets(2)).toContainEqual(at(texts[2]!, "青葉港", "PLACE"));

    const single = await request(server.url).post(url).set("Authorization", `Bearer ${s.token}`).send({ text: texts[0] });
    expect(single.status).toBe(200);
    expect(single.body.results).toEqual([res.body.results[0]]);
  });

  it("refuses missing, malformed, wrong and revoked tokens and the session cookie with 401", async () => {
    const s = await setUp(server, "Quillon Yard");
    await s.lead.agent.put(`/api/orgs/${s.admin.orgId}/corpora/${s.corpusId}/suggester`).send({ taggerId: s.tagger.id });
    const url = `/api/v1/corpora/${s.corpusId}/tag`;
    const body = { text: "Mira Quell met Tobin Vale." };
    const cases: Array<[string, string | null]> = [
      ["missing", null],
      ["not bearer", `Basic ${Buffer.from("a:b").toString("base64")}`],
      ["malformed", "Bearer not-a-token"],
      ["wrong", `Bearer tgl_${"A".repeat(43)}`],
      ["two words", `Bearer ${s.token} extra`],
    ];
    for (const [name, header] of cases) {
      const req = request(server.url).post(url);
      if (header) req.set("Authorization", header);
      const res = await req.send(body);
      expect(res.status, name).toBe(401);
      expect(res.body.error.code, name).toBe("unauthenticated");
      expect(res.headers["www-authenticate"], name).toMatch(/^Bearer/);
    }
    // A member's session cookie (with the page's Origin) is not accepted on /api/v1.
    const cookie = await s.admin.agent.post(url).send(body);
    expect(cookie.status).toBe(401);
    // The token works, then is revoked.
    expect((await request(server.url).post(url).set("Authorization", `Bearer ${s.token}`).send(body)).status).toBe(200);
    const list = await s.lead.agent.get(`/api/orgs/${s.admin.orgId}/tokens`);
    expect(list.body.items[0].lastUsedAt).not.toBeNull();
    await s.lead.agent.delete(`/api/orgs/${s.admin.orgId}/tokens/${list.body.items[0].id}`);
    const revoked = await request(server.url).post(url).set("Authorization", `Bearer ${s.token}`).send(body);
    expect(revoked.status).toBe(401);
    expect(revoked.body.error.message).toMatch(/revoked/);
  });

  it("answers 404 for another organization's corpus, 400/413 for bad bodies, and 429 with Retry-After", async () => {
    const a = await setUp(limited, "Harrowgate Ledger");
    const b = await setUp(limited, "Copperline Desk");
    await b.lead.agent.put(`/api/orgs/${b.admin.orgId}/corpora/${b.corpusId}/suggester`).send({ taggerId: b.tagger.id });
    const auth = `Bearer ${a.token}`;
    const cross = await request(limited.url).post(`/api/v1/corpora/${b.corpusId}/tag`).set("Authorization", auth).send({ text: "Mira Quell" });
    expect(cross.status).toBe(404);
    expect(JSON.stringify(cross.body)).not.toContain("Copperline");
    const bad = await request(limited.url).post(`/api/v1/corpora/${a.corpusId}/tag`).set("Authorization", auth).send({ text: "x", texts: ["y"] });
    expect(bad.status).toBe(400);
    // Three requests per window on this server: the fourth is refused until the window ends.
    const big = await request(limited.url).post(`/api/v1/corpora/${a.corpusId}/tag`).set("Authorization", auth).send({ texts: Array.from({ length: 101 }, () => "a") });
    expect(big.status).toBe(413);
    expect(big.body.error.message).toMatch(/at most 100 texts/);
    expect(big.body.error.details.limits).toEqual({ maxTexts: 100, maxCharsPerText: 50_000, maxTotalChars: 500_000 });
    const over = await request(limited.url).post(`/api/v1/corpora/${a.corpusId}/tag`).set("Authorization", auth).send({ text: "Mira Quell" });
    expect(over.status).toBe(429);
    expect(over.body.error.code).toBe("rate_limited");
    expect(Number(over.headers["retry-after"])).toBeGreaterThanOrEqual(1);
    expect(Number(over.headers["retry-after"])).toBeLessThanOrEqual(60);
    // Another token has its own allowance.
    const other = await request(limited.url).post(`/api/v1/corpora/${b.corpusId}/tag`).set("Authorization", `Bearer ${b.token}`).send({ text: "Mira Quell met Tobin Vale." });
    expect(other.status).toBe(200);
  });
});
