import { spawnSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import type { TrainingRun } from "@tagloom/contracts";
import { loadModel, serializeModel, tagSentence } from "@tagloom/tagger";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { env, repoRoot } from "@/config/env";
import { db } from "@/db/knex";
import { type SignedIn, type TestServer, addSignedInMember, signUpFounder, startTestServer } from "./support/http";
import { createTrainingCorpus, generateDocuments } from "./support/training-data";
import { startTestWorkers, stopTestWorkers } from "./support/workers";
import { trainingRuns } from "./support/training-runs";

// Training runs end to end through pg-boss with the workers in this process.
let server: TestServer;
let lead: SignedIn;
let corpusId: string;
const tmp = mkdtempSync(join(tmpdir(), "tagloom-training-"));

beforeAll(async () => {
  server = await startTestServer();
  const founder = await signUpFounder(server, { organizationName: "Training Org" });
  lead = await addSignedInMember(server, founder.orgId, "data_lead");
  ({ corpusId } = await createTrainingCorpus(founder.orgId, { userId: founder.userId, email: founder.email }, "Supply memos", generateDocuments(40, 6, 11), generateDocuments(30, 6, 99)));
  await startTestWorkers();
}, 60_000);

afterAll(async () => {
  await stopTestWorkers();
  rmSync(tmp, { recursive: true, force: true });
});

const base = () => `/api/orgs/${lead.orgId}/corpora/${corpusId}`;

const { waitForRun, trainedRun } = trainingRuns(() => lead.agent, base, 60_000);

async function download(taggerId: string): Promise<string> {
  const res = await lead.agent.get(`${base()}/taggers/${taggerId}/download`).buffer(true).parse((r, cb) => {
    const chunks: Buffer[] = [];
    r.on("data", (c: Buffer) => chunks.push(c));
    r.on("end", () => cb(null, Buffer.concat(chunks).toString("utf8")));
  });
  expect(res.status).toBe(200);
  return res.body as string;
}

const queued = async () => Number((await db.raw("SELECT count(*)::int AS n FROM pgboss.job WHERE name LIKE 'training-%'")).rows[0].n);

let defaultRun: TrainingRun;

describe("a training run with the defaults", () => {
  it("an empty body trains with the engine defaults, and the stored evaluation equals the CLI's evaluate --json", async () => {
    defaultRun = await trainedRun({});
    expect(defaultRun.config.crossValidationFolds).toBe(5);
    expect(defaultRun.documentCounts).toEqual({ train: 30, test: 10, unlabelled: 0 });
    expect(defaultRun.taggerId).not.toBeNull();
    const log = (await db("training_runs").where({ id: defaultRun.id }).first("log")).log as { stage: string }[];
    expect(log.map((l) => l.stage)).toEqual(["loading", "counting", "smoothing", "cross_validation", "evaluation", "storing"]);
    const e = defaultRun.evaluation!;

    // Outside check: the CLI of packages/tagger trains on the exported CoNLL of the training split
    // with the same (default) options and evaluates on the exported test split.
    for (const split of ["train", "test"]) {
      const res = await lead.agent.get(`${base()}/exports?format=conll&split=${split}`).buffer(true);
      expect(res.status).toBe(200);
      writeFileSync(join(tmp, `${split}.conll`), res.text);
    }
    const tsx = join(repoRoot, "packages/tagger/node_modules/.bin/tsx");
    const cli = join(repoRoot, "packages/tagger/src/cli.ts");
    const out = spawnSync(tsx, [cli, "evaluate", "--train", join(tmp, "train.conll"), "--test", join(tmp, "test.conll"), "--json", "--folds", "5"], {
      encoding: "utf8",
      timeout: 120_000,
    });
    expect(out.status, out.stderr).toBe(0);
    const cliResult = JSON.parse(out.stdout);
    const r6 = (x: number) => Number(x.toFixed(6));
    expect({ p: r6(e.overall.precision), r: r6(e.overall.recall), f1: r6(e.overall.f1) }).toEqual({ p: cliResult.overall.precision, r: cliResult.overall.recall, f1: cliResult.overall.f1 });
    expect(r6(e.tokenAccuracy)).toBe(cliResult.tokenAccuracy);
    expect([e.tokens, e.sentences]).toEqual([cliResult.tokens, cliResult.sentences]);
    expect(Object.fromEntries(e.types.map((t) => [t.type, { precision: r6(t.precision), recall: r6(t.recall), f1: r6(t.f1), support: t.support }]))).toEqual(cliResult.types);
    expect(e.crossValidation!.f1).toEqual(cliResult.crossValidation.f1);
    expect(e.crossValidation!.tokenAccuracy).toEqual(cliResult.crossValidation.tokenAccuracy);

    // The rest of the tagger page's figures.
    expect(e.learningCurve.map((p) => p.fraction)).toEqual([0.1, 0.25, 0.5, 1]);
    expect(e.learningCurve.at(-1)!.documents).toBe(30);
    expect(e.confusion.types).toEqual(["ORG", "PERSON", "PLACE", "PRODUCT"]);
    const goldTokens = e.confusion.counts.reduce((n, row, g) => n + row.reduce((a, b) => a + b, 0) + e.confusion.missed[g]!, 0);
    expect(goldTokens).toBeGreaterThan(0);
    expect(e.semiSupervised).toBeNull();
  });

  it("the downloaded tagger is the model JSON the CLI reads, and tags a sentence", async () => {
    const text = await download(defaultRun.taggerId!);
    const model = loadModel(JSON.parse(text));
    expect(JSON.stringify(serializeModel(model))).toBe(text);
    const tagged = tagSentence(model, ["Wren", "Odalsby", "of", "Brackenfold", "Ltd", "signed", "."]);
    expect(tagged.chunks.map((c) => c.type)).toContain("ORG");
    const tagger = await lead.agent.get(`${base()}/taggers/${defaultRun.taggerId}`);
    expect(tagger.body.label).toBe("Tagger v1 of Supply memos");
    const ev = await lead.agent.get(`${base()}/taggers/${defaultRun.taggerId}/evaluation`);
    expect(ev.status).toBe(200);
    expect(ev.headers["content-disposition"]).toContain("attachment");
  });

  it("repeat gives a byte-identical tagger", async () => {
    const res = await lead.agent.post(`${base()}/runs/${defaultRun.id}/repeat`).send({});
    expect(res.status).toBe(202);
    expect(res.body.repeatOfRunId).toBe(defaultRun.id);
    const again = await waitForRun(res.body.id);
    expect(again.status).toBe("succeeded");
    expect(again.taggerId).not.toBe(defaultRun.taggerId);
    expect(await download(again.taggerId!)).toBe(await download(defaultRun.taggerId!));
    expect(again.evaluation).toEqual(defaultRun.evaluation);
  });

  it("a run split into shards stores the same tagger as a single-shard run", async () => {
    const before = env.TRAINING_SHARD_TOKENS;
    env.TRAINING_SHARD_TOKENS = 300;
    let sharded: TrainingRun;
    try {
      sharded = await trainedRun({ crossValidationFolds: null });
    } finally {
      env.TRAINING_SHARD_TOKENS = before;
    }
    expect(sharded.shardCount).toBeGreaterThan(3);
    const single = await trainedRun({ crossValidationFolds: null });
    expect(single.shardCount).toBe(1);
    expect(await download(sharded.taggerId!)).toBe(await download(single.taggerId!));
  });

  it("the audit log has the start, repeat and download", async () => {
    const actions = (await db("audit_events").where({ organization_id: lead.orgId }).select("action")).map((r) => r.action);
    expect(actions).toEqual(expect.arrayContaining(["training_run.started", "training_run.repeated", "tagger.downloaded"]));
    expect(await db("audit_events").where({ organization_id: lead.orgId, action: "tagger.downloaded" }).whereNotNull("target_id").count<{ n: number }[]>({ n: "*" })).not.toEqual([{ n: 0 }]);
  });
});

describe("learning from unlabelled documents", () => {
  it("EM and sampling store each pass's log-likelihood and cost; sampling holds fewer bytes of statistics", async () => {
    const em = await trainedRun({ crossValidationFolds: null, semi: "em", iterations: 3 });
    const sample = await trainedRun({ crossValidationFolds: null, semi: "sample", iterations: 3 });
    expect(em.documentCounts.unlabelled).toBe(30);
    for (const run of [em, sample]) {
      expect(run.iterations.map((i) => i.iteration)).toEqual([1, 2, 3]);
      expect(run.evaluation!.semiSupervised!.iterations).toEqual(run.iterations);
      for (const i of run.iterations) expect(Number.isFinite(i.logLikelihood) && i.logLikelihood < 0).toBe(true);
    }
    expect(sample.iterations[0]!.statisticsBytes).toBeLessThan(em.iterations[0]!.statisticsBytes);
  });

  it("a running run stops at the next pass when cancelled, and stores no tagger", async () => {
    const res = await lead.agent.post(`${base()}/runs`).send({ crossValidationFolds: null, semi: "em", iterations: 50 });
    expect(res.status).toBe(202);
    const until = Date.now() + 60_000;
    let run = res.body as TrainingRun;
    while (run.iterations.length === 0 && Date.now() < until) {
      await new Promise((r) => setTimeout(r, 50));
      run = (await lead.agent.get(`${base()}/runs/${run.id}`)).body;
    }
    expect([run.status, run.stage]).toEqual(["running", "unlabelled"]);
    const cancel = await lead.agent.post(`${base()}/runs/${run.id}/cancel`).send({});
    expect([cancel.status, cancel.body.cancelRequested]).toEqual([200, true]);
    const done = await waitForRun(run.id);
    expect([done.status, done.taggerId]).toEqual(["cancelled", null]);
    expect(done.iterations.length).toBeLessThan(50);
  });
});

describe("runs that must not start", () => {
  it("a bad config answers 400 with field details and queues nothing", async () => {
    const runs = await db("training_runs").count<{ n: number }[]>({ n: "*" });
    const jobs = await queued();
    const res = await lead.agent.post(`${base()}/runs`).send({ smoothing: { emission: -1 }, order: 3, testSplit: { kind: "holdout", percent: 95 }, bogus: 1 });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.details.fields)).toEqual(expect.arrayContaining(["smoothing.emission", "order", "testSplit.percent"]));
    expect(await db("training_runs").count<{ n: number }[]>({ n: "*" })).toEqual(runs);
    expect(await queued()).toBe(jobs);
  });

  it("an empty test split or no training documents answer 409 and queue nothing", async () => {
    const founder = await signUpFounder(server, { organizationName: "Empty Split Org" });
    const actor = { userId: founder.userId, email: founder.email };
    const onlyTrain = await createTrainingCorpus(founder.orgId, actor, "No tests", generateDocuments(3, 2, 5, 0));
    const jobs = await queued();
    const r1 = await founder.agent.post(`/api/orgs/${founder.orgId}/corpora/${onlyTrain.corpusId}/runs`).send({});
    expect([r1.status, r1.body.error.code]).toEqual([409, "empty_test_split"]);
    expect(r1.body.error.message).toContain("test split has no gold documents");
    const empty = await createTrainingCorpus(founder.orgId, actor, "Nothing", []);
    const r2 = await founder.agent.post(`/api/orgs/${founder.orgId}/corpora/${empty.corpusId}/runs`).send({ testSplit: { kind: "holdout", percent: 20 } });
    expect([r2.status, r2.body.error.code]).toEqual([409, "no_training_documents"]);
    expect(await queued()).toBe(jobs);
    expect(await db("training_runs").where({ organization_id: founder.orgId }).count<{ n: number }[]>({ n: "*" })).toEqual([{ n: 0 }]);
  });
});

describe("comparing two taggers", () => {
  it("scores both on the same test documents with a bootstrap interval, and shows a disagreement document", async () => {
    const other = await trainedRun({ crossValidationFolds: null, wordClasses: "none", suffixLength: 0, prevWord: false, contextEmissions: false, rare: 0, smoothing: { emission: 1 } });
    const res = await lead.agent.get(`${base()}/taggers/${defaultRun.taggerId}/compare/${other.taggerId}`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const c = res.body;
    expect(c.testDocuments).toBe(10);
    expect(c.overall.a.f1).toBeCloseTo(defaultRun.evaluation!.overall.f1, 12);
    expect(c.overall.f1Difference).toBeCloseTo(c.overall.b.f1 - c.overall.a.f1, 12);
    expect(c.bootstrap.delta).toBeCloseTo(c.overall.f1Difference, 12);
    expect(c.bootstrap.ci[0]).toBeLessThanOrEqual(c.bootstrap.ci[1]);
    expect(c.types.map((t: { type: string }) => t.type)).toEqual(["ORG", "PERSON", "PLACE", "PRODUCT"]);
    expect(c.disagreements.length).toBeGreaterThan(0);
    {
      const d = c.disagreements[0];
      const doc = await lead.agent.get(`${base()}/taggers/${defaultRun.taggerId}/compare/${other.taggerId}/documents/${d.documentId}`);
      expect(doc.status).toBe(200);
      expect(doc.body.gold.length).toBeGreaterThan(0);
      for (const s of [...doc.body.gold, ...doc.body.a, ...doc.body.b]) expect(doc.body.document.text.slice(s.start, s.end).trim()).not.toBe("");
      expect(doc.body.entityTypes.map((t: { name: string }) => t.name).sort()).toEqual(["ORG", "PERSON", "PLACE", "PRODUCT"]);
    }
    const list = await lead.agent.get(`${base()}/taggers?limit=2`);
    expect(list.body.items.map((t: { version: number }) => t.version)).toEqual([7, 6]);
    const cancel = await lead.agent.post(`${base()}/runs/${defaultRun.id}/cancel`).send({});
    expect([cancel.status, cancel.body.error.code]).toEqual([409, "run_finished"]);
  });
});
