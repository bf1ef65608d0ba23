import type { TrainingRun } from "@tagloom/contracts";
import { MODEL_SCHEMA_VERSION, type SerializedModel, loadModel, tagSentence, tokenizeText } from "@tagloom/tagger";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { env } from "@/config/env";
import { db } from "@/db/knex";
import { type SignedIn, type TestServer, addSignedInMember, signUpFounder, startTestServer } from "./support/http";
import { type GeneratedDocument, createTrainingCorpus, generateDocuments } from "./support/training-data";
import { startTestWorkers, stopTestWorkers } from "./support/workers";
import { trainingRuns } from "./support/training-runs";

// Runs with word clusters (learnt from the corpus's documents without gold) and perceptron passes,
// end to end through pg-boss with the workers in this process.
let server: TestServer;
let lead: SignedIn;
let corpusId: string;
const gold = generateDocuments(24, 5, 11);
const unlabelled = generateDocuments(20, 5, 99);
// One document without gold that is marked as a test document: no run may read it.
const markedTest: GeneratedDocument = { title: "Memo unlabelled test", text: "Zorvexquill met Plumbrantide at the depot .", spans: [], split: "test" };

beforeAll(async () => {
  server = await startTestServer();
  const founder = await signUpFounder(server, { organizationName: "Clusters Org" });
  lead = await addSignedInMember(server, founder.orgId, "data_lead");
  ({ corpusId } = await createTrainingCorpus(founder.orgId, { userId: founder.userId, email: founder.email }, "Depot notes", gold, [...unlabelled, markedTest]));
  // createTrainingCorpus stores documents without gold with no split; mark the last one as test.
  await db("documents").where({ corpus_id: corpusId, title: markedTest.title }).update({ split: "test" });
  await startTestWorkers();
}, 60_000);

afterAll(async () => {
  await stopTestWorkers();
});

const base = () => `/api/orgs/${lead.orgId}/corpora/${corpusId}`;

const { waitForRun, trainedRun } = trainingRuns(() => lead.agent, base, 120_000);

async function storedModel(taggerId: string): Promise<SerializedModel> {
  const row = await db("taggers").where({ id: taggerId }).first("model");
  const text = typeof row.model === "string" ? row.model : JSON.stringify(row.model);
  return JSON.parse(text) as SerializedModel;
}

const wordsOf = (docs: GeneratedDocument[]) => new Set(docs.flatMap((d) => tokenizeText(d.text).tokens.map((t) => d.text.slice(t.start, t.end))));
const tokensOf = (d: GeneratedDocument) => tokenizeText(d.text).tokens.length;
const queued = async () => Number((await db.raw("SELECT count(*)::int AS n FROM pgboss.job WHERE name LIKE 'training-%'")).rows[0].n);

describe("a run with word clusters", () => {
  it("trains in one piece even when it would shard, records the settings and the documents without gold it read, and its model holds their words' clusters", async () => {
    const before = env.TRAINING_SHARD_TOKENS;
    env.TRAINING_SHARD_TOKENS = 200;
    let run: TrainingRun;
    try {
      run = await trainedRun({ clusters: 12, crossValidationFolds: null });
    } finally {
      env.TRAINING_SHARD_TOKENS = before;
    }
    expect(run.shardCount).toBe(1);
    expect([run.config.clusters, run.config.perceptron]).toEqual([12, 0]);
    // Every document without gold except the one marked as a test document.
    expect(run.documentCounts).toEqual({ train: 18, test: 6, unlabelled: 20, unlabelledTokens: unlabelled.reduce((n, d) => n + tokensOf(d), 0) });

    const model = await storedModel(run.taggerId!);
    expect(model.schemaVersion).toBe(MODEL_SCHEMA_VERSION);
    expect(model.schemaVersion).toBe(7);
    expect(model.config.clusters).toBe(12);
    const clusters = model.parameters.clusters!;
    expect(clusters).not.toBeNull();
    // Words that only the documents without gold hold got clusters: the clustering read them.
    const goldWords = wordsOf(gold);
    const onlyUnlabelled = [...wordsOf(unlabelled)].filter((w) => !goldWords.has(w));
    expect(onlyUnlabelled.length).toBeGreaterThan(5);
    const clustered = new Set(clusters.words);
    for (const w of onlyUnlabelled) expect(clustered.has(w), w).toBe(true);
    // ... and the test document's text did not.
    expect(clustered.has("Zorvexquill")).toBe(false);
    const loaded = loadModel(model);
    expect(tagSentence(loaded, ["Wren", "Odalsby", "of", "Brackenfold", "Ltd", "signed", "."]).tags).toHaveLength(7);
  });

  it("with EM as well, stores each pass and the clusters", async () => {
    const run = await trainedRun({ clusters: 8, semi: "em", iterations: 2, crossValidationFolds: null });
    expect(run.iterations.map((i) => i.iteration)).toEqual([1, 2]);
    expect(run.evaluation!.semiSupervised!.iterations).toEqual(run.iterations);
    for (const i of run.iterations) expect(Number.isFinite(i.logLikelihood) && i.logLikelihood < 0).toBe(true);
    expect((await storedModel(run.taggerId!)).parameters.clusters).not.toBeNull();
  });

  it("reads documents without gold up to the token limit and records how many it left out", async () => {
    const before = env.TRAINING_UNLABELLED_TOKENS;
    // Room for exactly the first three documents without gold (upload order).
    const limit = tokensOf(unlabelled[0]!) + tokensOf(unlabelled[1]!) + tokensOf(unlabelled[2]!);
    env.TRAINING_UNLABELLED_TOKENS = limit;
    let run: TrainingRun;
    try {
      run = await trainedRun({ clusters: 4, crossValidationFolds: null });
    } finally {
      env.TRAINING_UNLABELLED_TOKENS = before;
    }
    expect(run.documentCounts).toMatchObject({ unlabelled: 3, unlabelledLeftOut: 17, unlabelledTokens: limit });
    const again = (await lead.agent.post(`${base()}/runs/${run.id}/repeat`).send({})).body as TrainingRun;
    expect(again.documentCounts.unlabelledLeftOut).toBe(17);
    expect((await waitForRun(again.id)).status).toBe("succeeded");
  });
});

describe("a run with perceptron passes", () => {
  it("trains in one piece and stores the learned weights, over word and neighbour features unless told otherwise", async () => {
    const run = await trainedRun({ perceptron: 2, crossValidationFolds: null });
    expect([run.shardCount, run.config.perceptron, run.config.perceptronFeatures, run.config.clusters, run.documentCounts.unlabelled]).toEqual([1, 2, "neighbours", 0, 0]);
    const model = await storedModel(run.taggerId!);
    expect([model.config.perceptron, model.config.perceptronFeatures]).toEqual([2, "neighbours"]);
    expect(model.parameters.neighbourFeatures).toBeTruthy();
    // Per-symbol weights when asked for.
    const bySymbol = await trainedRun({ perceptron: 2, perceptronFeatures: "symbol", crossValidationFolds: null });
    expect(bySymbol.config.perceptronFeatures).toBe("symbol");
    expect((await storedModel(bySymbol.taggerId!)).parameters.corrections).toBeTruthy();
  });

  it("a run without either records both as 0 and reads no documents without gold", async () => {
    const run = await trainedRun({ crossValidationFolds: null });
    expect([run.config.clusters, run.config.perceptron]).toEqual([0, 0]);
    expect(run.documentCounts).toEqual({ train: 18, test: 6, unlabelled: 0 });
    expect((await storedModel(run.taggerId!)).parameters.clusters).toBeNull();
  });
});

describe("settings out of range", () => {
  it("answer 400 with a message on the field, and create and queue nothing", async () => {
    const runs = await db("training_runs").count<{ n: number }[]>({ n: "*" });
    const jobs = await queued();
    const cases: Array<[object, string, string]> = [
      [{ clusters: 1001 }, "clusters", "Use at most 1000 clusters."],
      [{ clusters: -1 }, "clusters", "Use 0 clusters (off) or more."],
      [{ clusters: 2.5 }, "clusters", "Use a whole number of clusters."],
      [{ clusters: "ten" }, "clusters", "Enter a number."],
      [{ perceptron: 21 }, "perceptron", "Use at most 20 passes."],
      [{ perceptron: -3 }, "perceptron", "Use 0 passes (off) or more."],
      [{ perceptron: 2, order: 2, perceptronFeatures: "symbol" }, "perceptronFeatures", "Weights per word need model order 1; choose word or neighbour features."],
      [{ perceptron: 2, perceptronFeatures: "words" }, "perceptronFeatures", "Choose symbol, word-type or neighbours."],
    ];
    for (const [body, field, message] of cases) {
      const res = await lead.agent.post(`${base()}/runs`).send(body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.details.fields[field], JSON.stringify(res.body)).toEqual([message]);
    }
    expect(await db("training_runs").count<{ n: number }[]>({ n: "*" })).toEqual(runs);
    expect(await queued()).toBe(jobs);
  });
});
