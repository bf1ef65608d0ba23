import type { Page, RunListQuery, StartRunInput, TrainingRun } from "@tagloom/contracts";
import { createRng } from "@tagloom/tagger";
import { type Actor, recordAudit } from "@/audit/audit.service";
import { getCorpus } from "@/corpora/corpora.service";
import { decodePageCursor, encodePageCursor } from "@/corpora/page-cursor";
import { env } from "@/config/env";
import { db as defaultDb } from "@/db/knex";
import { type Db, isUuid } from "@/db/types";
import { ConflictError, NotFoundError } from "@/errors";
import { enqueueJob } from "@/jobs/boss";
import { readsUnlabelled, resolveRunConfig, trainsInOnePiece } from "./run-config";
import {
  type CorpusDocumentForRun,
  type DocumentCounts,
  type NewRun,
  type RunDocument,
  type RunRow,
  findRun,
  insertRun,
  insertRunDocuments,
  insertShards,
  listCorpusDocumentsForRun,
  listRunDocuments,
  listRunRows,
  lockRun,
  updateRun,
} from "./training-runs.repository";
import { findTaggerOfRun } from "./taggers.repository";

/** pg-boss queue of the job that loads a run's documents and plans its shards. */
export const TRAINING_LOAD_QUEUE = "training-load";
export const TRAINING_SHARD_QUEUE = "training-shard";
export const TRAINING_FINISH_QUEUE = "training-finish";

/** Payload of every training job. */
export type TrainingJobData = { organizationId: string; runId: string; shard?: number };

/** Sends a training job with the expiry after which a job whose worker died is retried. */
export async function enqueueTrainingJob(queue: string, data: TrainingJobData): Promise<void> {
  await enqueueJob(queue, data, { expireInSeconds: env.TRAINING_JOB_EXPIRE_SECONDS, retryLimit: 3, retryDelay: 1 });
}

async function toRun(row: RunRow, db?: Db): Promise<TrainingRun> {
  const tagger = row.status === "succeeded" ? await findTaggerOfRun(row.organizationId, row.id, db) : null;
  return {
    id: row.id,
    corpusId: row.corpusId,
    number: row.number,
    status: row.status,
    stage: row.stage,
    progress: row.progress,
    cancelRequested: row.cancelRequested,
    iterations: row.iterations,
    error: row.error,
    config: row.config,
    seed: row.seed,
    testSplit: row.testSplit,
    documentCounts: row.documentCounts,
    shardCount: row.shardCount,
    taggerId: tagger?.id ?? null,
    evaluation: tagger?.evaluation ?? null,
    repeatOfRunId: row.repeatOf,
    createdAt: row.createdAt,
    startedAt: row.startedAt,
    finishedAt: row.finishedAt,
    createdBy: row.createdBy,
  };
}

async function requireRun(organizationId: string, corpusId: string, runId: string, db?: Db): Promise<RunRow> {
  await getCorpus(organizationId, corpusId, db);
  if (!isUuid(runId)) throw new NotFoundError("training run");
  const row = await findRun(organizationId, runId, db);
  if (!row || row.corpusId !== corpusId) throw new NotFoundError("training run");
  return row;
}

export async function getRun(organizationId: string, corpusId: string, runId: string): Promise<TrainingRun> {
  return toRun(await requireRun(organizationId, corpusId, runId));
}

export async function listRuns(organizationId: string, corpusId: string, query: RunListQuery): Promise<Page<TrainingRun>> {
  await getCorpus(organizationId, corpusId);
  const after = decodePageCursor(query.cursor, "integer");
  const rows = await listRunRows(organizationId, corpusId, { limit: query.limit + 1, afterNumber: after ? Number(after.value) : undefined });
  const more = rows.length > query.limit;
  const page = more ? rows.slice(0, query.limit) : rows;
  const last = page[page.length - 1];
  return { items: await Promise.all(page.map((r) => toRun(r))), nextCursor: more && last ? encodePageCursor(last.number, last.id) : null };
}

/**
 * Splits gold documents into training and test documents: the corpus's `test` documents, or a
 * hold-out of `percent` % drawn with the run's seed (Fisher–Yates shuffle through the engine's
 * seeded generator; the chosen documents keep their upload order).
 */
export function splitDocuments(
  docs: CorpusDocumentForRun[],
  testSplit: NewRun["testSplit"],
  seed: number,
): { train: CorpusDocumentForRun[]; test: CorpusDocumentForRun[] } {
  const gold = docs.filter((d) => d.gold);
  if (testSplit.kind === "corpus") return { train: gold.filter((d) => d.split !== "test"), test: gold.filter((d) => d.split === "test") };
  const n = gold.length;
  const size = n === 0 ? 0 : Math.min(n - 1, Math.max(1, Math.round((testSplit.percent / 100) * n)));
  const order = gold.map((_, i) => i);
  const rng = createRng(seed);
  for (let i = n - 1; i > 0; i--) {
    const j = rng.nextInt(i + 1);
    [order[i], order[j]] = [order[j]!, order[i]!];
  }
  const held = new Set(order.slice(0, size));
  return { train: gold.filter((_, i) => !held.has(i)), test: gold.filter((_, i) => held.has(i)) };
}

/**
 * The documents a run may read without gold (word clusters, EM, sampling): those with no gold and
 * not marked as test documents (a test document's text stays out of training even before it has
 * gold), in upload order, until their tokens reach `tokenLimit`; the first document that would
 * pass the limit and all after it are left out (so a repeat reads the same ones).
 */
export function selectUnlabelled(docs: CorpusDocumentForRun[], tokenLimit: number): { chosen: CorpusDocumentForRun[]; leftOut: number } {
  const candidates = docs.filter((d) => !d.gold && d.split !== "test");
  const chosen: CorpusDocumentForRun[] = [];
  let tokens = 0;
  for (const d of candidates) {
    if (tokens + d.tokens > tokenLimit) break;
    chosen.push(d);
    tokens += d.tokens;
  }
  return { chosen, leftOut: candidates.length - chosen.length };
}

/** Gives consecutive training documents the same shard until a shard holds `shardTokens` tokens. */
export function assignShards(train: CorpusDocumentForRun[], shardTokens: number): number[] {
  const shards: number[] = [];
  let shard = 0;
  let tokens = 0;
  for (const d of train) {
    if (tokens > 0 && tokens + d.tokens > shardTokens) {
      shard++;
      tokens = 0;
    }
    shards.push(shard);
    tokens += d.tokens;
  }
  return shards;
}

async function createRun(
  organizationId: string,
  corpusId: string,
  settings: Pick<NewRun, "config" | "seed" | "testSplit">,
  documents: RunDocument[],
  repeatOf: string | null,
  actor: Actor,
  trx: Db,
  unlabelledLeftOut = 0,
): Promise<RunRow> {
  await trx.raw("SELECT pg_advisory_xact_lock(hashtext(?))", [`training_runs:${corpusId}`]);
  const counts: DocumentCounts = { train: 0, test: 0, unlabelled: 0 };
  let unlabelledTokens = 0;
  for (const d of documents) {
    counts[d.role]++;
    if (d.role === "unlabelled") unlabelledTokens += d.tokens;
  }
  if (counts.unlabelled > 0) counts.unlabelledTokens = unlabelledTokens;
  if (unlabelledLeftOut > 0) counts.unlabelledLeftOut = unlabelledLeftOut;
  const shardCount = documents.reduce((m, d) => (d.role === "train" ? Math.max(m, d.shard + 1) : m), 0);
  const run = await insertRun({ organizationId, corpusId, ...settings, documentCounts: counts, shardCount, repeatOf, createdBy: actor.userId }, trx);
  await insertRunDocuments(organizationId, run.id, documents, trx);
  const shards = new Map<number, { shard: number; documents: number; tokens: number }>();
  for (const d of documents) {
    if (d.role !== "train") continue;
    const s = shards.get(d.shard) ?? { shard: d.shard, documents: 0, tokens: 0 };
    s.documents++;
    s.tokens += d.tokens;
    shards.set(d.shard, s);
  }
  await insertShards(organizationId, run.id, [...shards.values()], trx);
  return run;
}

/**
 * Starts a training run: records the documents (training, test and, for word clusters, EM or
 * sampling, the corpus's documents without gold up to the token limit), the gold version of each, the config and the seed, then
 * queues the loading job. Refuses (409, nothing queued) without a gold training document or with
 * an empty test split.
 */
export async function startRun(organizationId: string, corpusId: string, input: StartRunInput, actor: Actor): Promise<TrainingRun> {
  const settings = resolveRunConfig(input);
  const run = await defaultDb.transaction(async (trx) => {
    const corpus = await getCorpus(organizationId, corpusId, trx);
    const docs = await listCorpusDocumentsForRun(organizationId, corpusId, trx);
    const { train, test } = splitDocuments(docs, settings.testSplit, settings.seed);
    if (train.length === 0) {
      throw new ConflictError(
        settings.testSplit.kind === "corpus"
          ? `The corpus "${corpus.name}" has no gold documents to train on outside the test split. Accept some annotated documents first.`
          : `The corpus "${corpus.name}" needs at least two gold documents to hold some out for testing.`,
        { trainDocuments: 0, testDocuments: test.length },
        "no_training_documents",
      );
    }
    if (test.length === 0) {
      throw new ConflictError(
        "The test split has no gold documents. Mark some gold documents as test documents, or hold out a percentage of them.",
        { trainDocuments: train.length, testDocuments: 0 },
        "empty_test_split",
      );
    }
    // A run that trains in one piece gets one shard whatever its size.
    const shards = assignShards(train, trainsInOnePiece(settings.config) ? Number.POSITIVE_INFINITY : env.TRAINING_SHARD_TOKENS);
    const documents: RunDocument[] = [
      ...train.map((d, i) => ({ documentId: d.id, role: "train" as const, position: i, goldVersion: d.goldVersion, shard: shards[i]!, tokens: d.tokens })),
      ...test.map((d, i) => ({ documentId: d.id, role: "test" as const, position: i, goldVersion: d.goldVersion, shard: 0, tokens: d.tokens })),
    ];
    let leftOut = 0;
    if (readsUnlabelled(settings.config)) {
      const unlabelled = selectUnlabelled(docs, env.TRAINING_UNLABELLED_TOKENS);
      unlabelled.chosen.forEach((d, i) => documents.push({ documentId: d.id, role: "unlabelled", position: i, goldVersion: null, shard: 0, tokens: d.tokens }));
      leftOut = unlabelled.leftOut;
    }
    const created = await createRun(organizationId, corpusId, settings, documents, null, actor, trx, leftOut);
    await recordAudit(trx, actor, organizationId, "training_run.started", { type: "training_run", id: created.id, label: `Run ${created.number} of ${corpus.name}` }, {
      config: settings.config,
      seed: settings.seed,
      testSplit: settings.testSplit,
      documentCounts: created.documentCounts,
    });
    return created;
  });
  await enqueueTrainingJob(TRAINING_LOAD_QUEUE, { organizationId, runId: run.id });
  return toRun(run);
}

/**
 * Starts the same config and seed on the same documents as a finished run. Refuses (409) when the
 * gold of any of its documents changed or a document was deleted: the result could not match.
 */
export async function repeatRun(organizationId: string, corpusId: string, runId: string, actor: Actor): Promise<TrainingRun> {
  const run = await defaultDb.transaction(async (trx) => {
    const corpus = await getCorpus(organizationId, corpusId, trx);
    const original = await requireRun(organizationId, corpusId, runId, trx);
    const recorded = await listRunDocuments(organizationId, runId, trx);
    const current = new Map((await listCorpusDocumentsForRun(organizationId, corpusId, trx)).map((d) => [d.id, d]));
    const changed = recorded.filter((d) => {
      const now = current.get(d.documentId);
      return !now || (d.goldVersion !== null && now.goldVersion !== d.goldVersion);
    });
    if (changed.length) {
      throw new ConflictError(
        `${changed.length} document${changed.length === 1 ? "" : "s"} of run ${original.number} changed or were deleted since it ran, so a repeat could not give the same tagger. Start a new run instead.`,
        { changedDocuments: changed.map((d) => d.documentId).slice(0, 50) },
        "run_data_changed",
      );
    }
    const documents = recorded.map((d) => ({ ...d, tokens: current.get(d.documentId)?.tokens ?? 0 }));
    const created = await createRun(
      organizationId,
      corpusId,
      { config: original.config, seed: original.seed, testSplit: original.testSplit },
      documents,
      original.id,
      actor,
      trx,
      original.documentCounts.unlabelledLeftOut ?? 0,
    );
    await recordAudit(trx, actor, organizationId, "training_run.repeated", { type: "training_run", id: created.id, label: `Run ${created.number} of ${corpus.name}` }, {
      repeatOf: original.id,
      repeatOfNumber: original.number,
    });
    return created;
  });
  await enqueueTrainingJob(TRAINING_LOAD_QUEUE, { organizationId, runId: run.id });
  return toRun(run);
}

/**
 * Cancels a run: a waiting run stops at once; a running one at its next check (between stages,
 * shards and iterations). A finished run answers 409.
 */
export async function cancelRun(organizationId: string, corpusId: string, runId: string, actor: Actor): Promise<TrainingRun> {
  const row = await defaultDb.transaction(async (trx) => {
    const corpus = await getCorpus(organizationId, corpusId, trx);
    await requireRun(organizationId, corpusId, runId, trx);
    const run = (await lockRun(organizationId, runId, trx))!;
    if (run.status === "succeeded" || run.status === "failed" || run.status === "cancelled") {
      throw new ConflictError(`Run ${run.number} has already finished (${run.status}).`, { status: run.status }, "run_finished");
    }
    if (run.status === "queued") await updateRun(organizationId, runId, { status: "cancelled", cancelRequested: true, finished: true }, trx);
    else await updateRun(organizationId, runId, { cancelRequested: true }, trx);
    await recordAudit(trx, actor, organizationId, "training_run.cancelled", { type: "training_run", id: run.id, label: `Run ${run.number} of ${corpus.name}` }, {
      status: run.status,
      stage: run.stage,
    });
    return (await findRun(organizationId, runId, trx))!;
  });
  return toRun(row);
}
