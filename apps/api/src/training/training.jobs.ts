import { performance } from "node:perf_hooks";
import type { RunIteration, RunStage } from "@tagloom/contracts";
import {
  type ColumnDocument,
  type ShardCounts,
  type ShardPlan,
  type ShardWordCounts,
  type TaggerModel,
  type TrainingConfig,
  countShard,
  countShardWords,
  createRng,
  crossValidate,
  evaluateModel,
  learningCurvePlan,
  mergeShardCounts,
  planShards,
  refineWithUnlabelled,
  serializeModel,
  trainFromShards,
  trainTagger,
} from "@tagloom/tagger";
import { z } from "zod";
import { listEntityTypes } from "@/corpora/corpora.service";
import { db } from "@/db/knex";
import { defineJob } from "@/jobs/registry";
import { logger } from "@/logger";
import { engineConfigOf, trainsInOnePiece } from "./run-config";
import { toColumnDocument, toWordSentences } from "./run-documents";
import { type LearningCurvePoint, buildEvaluation } from "./run-evaluation";
import { insertTagger } from "./taggers.service";
import { findTaggerOfRun } from "./taggers.repository";
import {
  type RunDocumentRole,
  type RunRow,
  clearShardCounts,
  countFinishedShards,
  findRun,
  findRunPlan,
  listShardSizes,
  findShardCounts,
  lockRun,
  storeShardCounts,
  streamRunDocuments,
  updateRun,
} from "./training-runs.repository";
import { TRAINING_FINISH_QUEUE, TRAINING_LOAD_QUEUE, TRAINING_SHARD_QUEUE, enqueueTrainingJob } from "./training-runs.service";

const payloadSchema = z.object({ organizationId: z.string().uuid(), runId: z.string().uuid(), shard: z.number().int().min(0).optional() });

/** A failure the data lead can act on: stored on the run in these words, never retried. */
class RunFailure extends Error {}
/** The run was cancelled (or already finished): stop quietly. */
class RunStopped extends Error {}

const LEARNING_CURVE_FRACTIONS = [0.1, 0.25, 0.5, 1];

/** Loads the run and stops when it was cancelled or finished; marks a cancel request as done. */
async function checkRun(organizationId: string, runId: string): Promise<RunRow> {
  const run = await findRun(organizationId, runId);
  if (!run || run.status === "succeeded" || run.status === "failed" || run.status === "cancelled") throw new RunStopped();
  if (run.cancelRequested) {
    await updateRun(organizationId, runId, { status: "cancelled", finished: true });
    throw new RunStopped();
  }
  return run;
}

async function enterStage(run: RunRow, stage: RunStage, progress: number): Promise<void> {
  await updateRun(run.organizationId, run.id, { status: "running", stage, progress, started: true, logStage: stage });
}

async function typeNamesOf(run: RunRow): Promise<Map<string, string>> {
  return new Map((await listEntityTypes(run.organizationId, run.corpusId)).map((t) => [t.id, t.name]));
}

/**
 * Reads the run's documents of a role (one shard or all) from a cursor, refusing gold that changed
 * since the run recorded it and documents deleted since, in words a data lead understands.
 */
async function* readLabelled(run: RunRow, role: RunDocumentRole, shard: number | null, expected: number, types: Map<string, string>): AsyncGenerator<ColumnDocument> {
  let seen = 0;
  for await (const row of streamRunDocuments(run.organizationId, run.id, role, shard)) {
    seen++;
    if (row.goldVersion === null || row.goldVersion !== row.recordedVersion) {
      throw new RunFailure(`The gold of the document "${row.title}" changed after this run started, so the run would not train on what it recorded. Start a new run.`);
    }
    yield toColumnDocument(row, types);
  }
  if (seen !== expected) {
    const missing = expected - seen;
    throw new RunFailure(`${missing} document${missing === 1 ? " was" : "s were"} deleted after this run started. Start a new run.`);
  }
}

async function collect<T>(source: AsyncIterable<T>): Promise<T[]> {
  const out: T[] = [];
  for await (const x of source) out.push(x);
  return out;
}

const shardSizes = (run: RunRow) => listShardSizes(run.organizationId, run.id);

/** Stage "loading": pass 1 over every training shard (word and tag counts), then the plan; queues the shard jobs. */
async function loadRun(organizationId: string, runId: string): Promise<void> {
  const run = await checkRun(organizationId, runId);
  await enterStage(run, "loading", 0.02);
  if (trainsInOnePiece(run.config)) {
    // No shard plan: the finishing job counts and trains from all the documents at once.
    await updateRun(organizationId, runId, { stage: "counting", progress: 0.15, logStage: "counting" });
    await enqueueTrainingJob(TRAINING_FINISH_QUEUE, { organizationId, runId });
    return;
  }
  const types = await typeNamesOf(run);
  const sizes = await shardSizes(run);
  const parts: ShardWordCounts[] = [];
  for (let shard = 0; shard < sizes.length; shard++) {
    // One shard's documents at a time: memory holds a shard, never the whole corpus.
    parts.push(countShardWords(await collect(readLabelled(run, "train", shard, sizes[shard]!, types))));
    await updateRun(organizationId, runId, { progress: 0.02 + (0.13 * (shard + 1)) / sizes.length });
  }
  const plan = planShards(parts, engineConfigOf(run.config, run.seed));
  await checkRun(organizationId, runId);
  await clearShardCounts(organizationId, runId);
  await updateRun(organizationId, runId, { plan: JSON.stringify(plan), stage: "counting", progress: 0.15, logStage: "counting" });
  for (let shard = 0; shard < sizes.length; shard++) await enqueueTrainingJob(TRAINING_SHARD_QUEUE, { organizationId, runId, shard });
}

/** Stage "counting": pass 2 over one shard; the last shard to finish queues the finishing job. */
async function countRunShard(organizationId: string, runId: string, shard: number): Promise<void> {
  const run = await checkRun(organizationId, runId);
  const planText = await findRunPlan(organizationId, runId);
  if (planText === null) throw new Error(`run ${runId} has no plan yet`);
  const plan = JSON.parse(planText) as ShardPlan;
  const sizes = await shardSizes(run);
  const documents = await collect(readLabelled(run, "train", shard, sizes[shard] ?? 0, await typeNamesOf(run)));
  const counts = countShard(documents, plan, engineConfigOf(run.config, run.seed));
  await storeShardCounts(organizationId, runId, shard, JSON.stringify(counts));
  const advance = await db.transaction(async (trx) => {
    const locked = await lockRun(organizationId, runId, trx);
    if (!locked || locked.stage !== "counting" || locked.status !== "running") return false;
    const { finished, total } = await countFinishedShards(organizationId, runId, trx);
    await updateRun(organizationId, runId, { progress: 0.15 + (0.3 * finished) / total }, trx);
    if (finished < total) return false;
    await updateRun(organizationId, runId, { stage: "smoothing", progress: 0.45 }, trx);
    return true;
  });
  if (advance) await enqueueTrainingJob(TRAINING_FINISH_QUEUE, { organizationId, runId });
}

type Trained = {
  run: RunRow;
  /** The model before any pass over the documents without gold. */
  supervised: TaggerModel;
  model: TaggerModel;
  semi: { method: "em" | "sample"; iterations: RunIteration[] } | null;
  /** The documents without gold the clustering read (empty without clusters). */
  clusterText: string[][][];
};

async function readUnlabelled(run: RunRow): Promise<string[][][]> {
  const unlabelled: string[][][] = [];
  for await (const row of streamRunDocuments(run.organizationId, run.id, "unlabelled", null)) unlabelled.push(toWordSentences(row));
  return unlabelled;
}

/** Reads every training document into `train` (in shard order). */
async function readTraining(run: RunRow, train: ColumnDocument[], types: Map<string, string>, sizes: number[]): Promise<void> {
  for (let shard = 0; shard < sizes.length; shard++) train.push(...(await collect(readLabelled(run, "train", shard, sizes[shard]!, types))));
}

/**
 * Stages counting → smoothing → unlabelled for a run with clusters or perceptron passes: one
 * trainTagger call over all the training documents, with the documents without gold as the
 * clustering's extra text; EM or sampling then run inside the engine in one call (their passes
 * are stored when it returns).
 */
async function trainInOnePiece(run: RunRow, config: Partial<TrainingConfig>, train: ColumnDocument[], types: Map<string, string>, sizes: number[]): Promise<Trained> {
  await enterStage(run, "counting", 0.15);
  await readTraining(run, train, types, sizes);
  const unlabelled = run.documentCounts.unlabelled > 0 ? await readUnlabelled(run) : [];
  const clusterText = run.config.clusters > 0 ? unlabelled : [];
  const supervised = trainTagger(train, { ...config, semi: "none" }, { unlabelled: clusterText }).model;
  run = await checkRun(run.organizationId, run.id);
  const method = run.config.semi;
  if (method === "none" || run.config.iterations === 0 || unlabelled.length === 0) return { run, supervised, model: supervised, semi: null, clusterText };
  await enterStage(run, "unlabelled", 0.5);
  const { model, history } = trainTagger(train, config, { unlabelled, rng: createRng(run.seed), now: () => performance.now() });
  const iterations = history.map((r, n) => ({ iteration: n + 1, logLikelihood: r.logLikelihood, seconds: r.seconds ?? 0, statisticsBytes: r.statisticsBytes }));
  run = await checkRun(run.organizationId, run.id);
  await updateRun(run.organizationId, run.id, { iterations, progress: 0.6 });
  return { run, supervised, model, semi: { method, iterations }, clusterText };
}

/** Stages smoothing → unlabelled iterations from the summed shard counts. */
async function trainFromShardCounts(run: RunRow, config: Partial<TrainingConfig>, train: ColumnDocument[], types: Map<string, string>, sizes: number[]): Promise<Trained> {
  const { organizationId, id: runId } = run;
  const plan = JSON.parse((await findRunPlan(organizationId, runId))!) as ShardPlan;
  await enterStage(run, "smoothing", 0.45);
  // Shards folded in one at a time, in shard order: memory holds two shards' counts, not all.
  let summed: ShardCounts | null = null;
  for (let shard = 0; shard < run.shardCount; shard++) {
    const text = await findShardCounts(organizationId, runId, shard);
    if (text === null) throw new Error(`run ${runId}: shard ${shard} has no counts`);
    const counts = JSON.parse(text) as ShardCounts;
    summed = summed === null ? counts : mergeShardCounts(summed, counts);
  }
  // The training documents, in shard order: the confidence calibration, cross-validation and the
  // learning curve read them.
  await readTraining(run, train, types, sizes);
  const { model: supervised, statistics } = trainFromShards(plan, [summed!], config, train);
  let model = supervised;

  const iterations: RunIteration[] = [];
  let semi: Trained["semi"] = null;
  const method = run.config.semi;
  if (method !== "none" && run.config.iterations > 0 && run.documentCounts.unlabelled > 0) {
    run = await checkRun(organizationId, runId);
    await enterStage(run, "unlabelled", 0.5);
    const unlabelled = await readUnlabelled(run);
    const rng = createRng(run.seed);
    for (let n = 0; n < run.config.iterations; n++) {
      // One pass at a time (the same sequence as one call with all iterations: each pass starts
      // from the previous model and the supervised counts, with the same generator), so that each
      // pass's log-likelihood is stored as it ends and a cancel is seen between passes.
      const step = refineWithUnlabelled(model, statistics, unlabelled, { method, iterations: 1, weight: run.config.weight, rng, now: () => performance.now() });
      model = step.model;
      const r = step.history[0]!;
      iterations.push({ iteration: n + 1, logLikelihood: r.logLikelihood, seconds: r.seconds ?? 0, statisticsBytes: r.statisticsBytes });
      await checkRun(organizationId, runId);
      await updateRun(organizationId, runId, { iterations, progress: 0.5 + (0.1 * (n + 1)) / run.config.iterations });
    }
    semi = { method, iterations };
  }
  return { run, supervised, model, semi, clusterText: [] };
}

/** Stages smoothing → unlabelled iterations → cross-validation → evaluation → storing. */
async function finishRun(organizationId: string, runId: string): Promise<void> {
  let run = await checkRun(organizationId, runId);
  if (await findTaggerOfRun(organizationId, runId)) {
    await updateRun(organizationId, runId, { status: "succeeded", stage: "storing", progress: 1, finished: true });
    return;
  }
  const config = engineConfigOf(run.config, run.seed);
  const types = await typeNamesOf(run);
  const sizes = await shardSizes(run);
  const train: ColumnDocument[] = [];
  const trained = trainsInOnePiece(run.config)
    ? await trainInOnePiece(run, config, train, types, sizes)
    : await trainFromShardCounts(run, config, train, types, sizes);
  const supervised = trained.supervised;
  const model = trained.model;
  run = trained.run;
  const semi = trained.semi;
  const clusterText = trained.clusterText;

  let crossValidation = null;
  const folds = run.config.crossValidationFolds;
  if (folds !== null) {
    run = await checkRun(organizationId, runId);
    await enterStage(run, "cross_validation", 0.6);
    try {
      crossValidation = crossValidate(train, config, folds);
    } catch (err) {
      if (err instanceof RangeError) {
        throw new RunFailure(`Cross-validation needs more data: ${err.message}. Use fewer folds or switch cross-validation off.`);
      }
      throw err;
    }
  }

  run = await checkRun(organizationId, runId);
  await enterStage(run, "evaluation", 0.8);
  const test = await collect(readLabelled(run, "test", null, run.documentCounts.test, types));
  const result = evaluateModel(model, test);
  const learningCurve: LearningCurvePoint[] = [];
  const steps = learningCurvePlan(train.length, { fractions: LEARNING_CURVE_FRACTIONS, rng: createRng(run.seed) });
  for (const step of steps) {
    const subset = step.documentIndices.map((i) => train[i]!);
    const curveModel = step.documentIndices.length === train.length ? supervised : trainTagger(subset, { ...config, semi: "none" }, { unlabelled: clusterText }).model;
    const scored = evaluateModel(curveModel, test);
    const e = scored.entities;
    learningCurve.push({
      fraction: step.fraction,
      documents: subset.length,
      tokens: subset.reduce((n, d) => n + d.sentences.reduce((m, s) => m + s.words.length, 0), 0),
      f1: e?.overall.f1 ?? 0,
      precision: e?.overall.precision ?? 0,
      recall: e?.overall.recall ?? 0,
      tokenAccuracy: scored.tokenAccuracy,
    });
  }
  const evaluation = buildEvaluation({ test, result, crossValidation, learningCurve, semi });

  run = await checkRun(organizationId, runId);
  await enterStage(run, "storing", 0.95);
  const modelText = JSON.stringify(serializeModel(model));
  await db.transaction(async (trx) => {
    const locked = await lockRun(organizationId, runId, trx);
    if (!locked || locked.status !== "running") return;
    if (!(await findTaggerOfRun(organizationId, runId, trx))) {
      await insertTagger({ organizationId, corpusId: run.corpusId, runId, modelText, evaluation }, trx);
    }
    await updateRun(organizationId, runId, { status: "succeeded", progress: 1, finished: true, plan: null }, trx);
  });
}

/** Runs a stage; stores a RunFailure or an engine error as the run's error; rethrows the rest for pg-boss to retry. */
async function guarded(organizationId: string, runId: string, work: () => Promise<void>): Promise<void> {
  try {
    await work();
  } catch (err) {
    if (err instanceof RunStopped) return;
    const message =
      err instanceof RunFailure
        ? err.message
        : err instanceof RangeError || err instanceof TypeError
          ? `Training stopped: ${err.message}. Change the settings or the gold documents and start a new run.`
          : null;
    if (message === null) throw err;
    logger.warn({ runId, err }, "training run failed");
    await updateRun(organizationId, runId, { status: "failed", error: message, finished: true });
  }
}

const parse = (data: unknown) => payloadSchema.parse(data);

defineJob({
  queue: TRAINING_LOAD_QUEUE,
  handle: async (data) => {
    const { organizationId, runId } = parse(data);
    await guarded(organizationId, runId, () => loadRun(organizationId, runId));
  },
});

defineJob({
  queue: TRAINING_SHARD_QUEUE,
  concurrency: 1,
  handle: async (data) => {
    const { organizationId, runId, shard } = parse(data);
    await guarded(organizationId, runId, () => countRunShard(organizationId, runId, shard ?? 0));
  },
});

defineJob({
  queue: TRAINING_FINISH_QUEUE,
  handle: async (data) => {
    const { organizationId, runId } = parse(data);
    await guarded(organizationId, runId, () => finishRun(organizationId, runId));
  },
});
