import type { ResolvedTrainingConfig, RunIteration, RunStage, RunStatus, TestSplit } from "@tagloom/contracts";
import { db as defaultDb } from "@/db/knex";
import { type Db, iso } from "@/db/types";

export type RunDocumentRole = "train" | "test" | "unlabelled";
/** Documents of a run per role, and those without gold left out by the token limit (when any). */
export type DocumentCounts = { train: number; test: number; unlabelled: number; unlabelledLeftOut?: number; unlabelledTokens?: number };

/** A training run row, camelCase; the plan is read separately (it can be megabytes). */
export type RunRow = {
  id: string;
  organizationId: string;
  corpusId: string;
  number: number;
  status: RunStatus;
  stage: RunStage | null;
  config: ResolvedTrainingConfig;
  seed: number;
  testSplit: TestSplit;
  progress: number;
  iterations: RunIteration[];
  documentCounts: DocumentCounts;
  shardCount: number;
  error: string | null;
  cancelRequested: boolean;
  repeatOf: string | null;
  createdBy: string | null;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
  cursorAt: string;
};

type Raw = Record<string, unknown>;

const toRun = (r: Raw): RunRow => ({
  id: r.id as string,
  organizationId: r.organization_id as string,
  corpusId: r.corpus_id as string,
  number: r.number as number,
  status: r.status as RunStatus,
  stage: (r.stage as RunStage | null) ?? null,
  // Runs recorded before clusters and perceptron passes existed trained without them.
  config: { clusters: 0, perceptron: 0, perceptronFeatures: "symbol", ...(r.config as Partial<ResolvedTrainingConfig>) } as ResolvedTrainingConfig,
  seed: r.seed as number,
  testSplit: r.test_split as TestSplit,
  progress: Number(r.progress),
  iterations: r.iterations as RunIteration[],
  documentCounts: r.document_counts as RunRow["documentCounts"],
  shardCount: r.shard_count as number,
  error: (r.error as string | null) ?? null,
  cancelRequested: r.cancel_requested as boolean,
  repeatOf: (r.repeat_of as string | null) ?? null,
  createdBy: (r.created_by as string | null) ?? null,
  createdAt: iso(r.created_at as Date)!,
  startedAt: iso(r.started_at as Date | null),
  finishedAt: iso(r.finished_at as Date | null),
  cursorAt: r.cursor_at as string,
});

const runColumns = (db: Db) => [
  "id",
  "organization_id",
  "corpus_id",
  "number",
  "status",
  "stage",
  "config",
  "seed",
  "test_split",
  "progress",
  "iterations",
  "document_counts",
  "shard_count",
  "error",
  "cancel_requested",
  "repeat_of",
  "created_by",
  "created_at",
  "started_at",
  "finished_at",
  db.raw("created_at::text AS cursor_at"),
];

export async function findRun(organizationId: string, runId: string, db: Db = defaultDb): Promise<RunRow | null> {
  const r = await db("training_runs").where({ organization_id: organizationId, id: runId }).first(runColumns(db));
  return r ? toRun(r) : null;
}

/** Locks the run row for the rest of the transaction. */
export async function lockRun(organizationId: string, runId: string, db: Db): Promise<RunRow | null> {
  const r = await db("training_runs").where({ organization_id: organizationId, id: runId }).forUpdate().first(runColumns(db));
  return r ? toRun(r) : null;
}

/** Newest first. */
export async function listRunRows(
  organizationId: string,
  corpusId: string,
  options: { limit: number; afterNumber?: number | undefined },
  db: Db = defaultDb,
): Promise<RunRow[]> {
  const q = db("training_runs").where({ organization_id: organizationId, corpus_id: corpusId }).select(runColumns(db));
  if (options.afterNumber !== undefined) q.andWhere("number", "<", options.afterNumber);
  return (await q.orderBy("number", "desc").limit(options.limit)).map(toRun);
}

export type NewRun = {
  organizationId: string;
  corpusId: string;
  config: ResolvedTrainingConfig;
  seed: number;
  testSplit: TestSplit;
  documentCounts: DocumentCounts;
  shardCount: number;
  repeatOf: string | null;
  createdBy: string | null;
};

/** Inserts a run with the corpus's next number; call inside a transaction holding the corpus's run lock. */
export async function insertRun(run: NewRun, db: Db): Promise<RunRow> {
  const next = await db("training_runs").where({ corpus_id: run.corpusId }).max<{ max: number | null }[]>({ max: "number" });
  const [r] = await db("training_runs")
    .insert({
      organization_id: run.organizationId,
      corpus_id: run.corpusId,
      number: (next[0]?.max ?? 0) + 1,
      config: JSON.stringify(run.config),
      seed: run.seed,
      test_split: JSON.stringify(run.testSplit),
      document_counts: JSON.stringify(run.documentCounts),
      shard_count: run.shardCount,
      repeat_of: run.repeatOf,
      created_by: run.createdBy,
    })
    .returning(runColumns(db));
  return toRun(r);
}

export async function updateRun(
  organizationId: string,
  runId: string,
  changes: Partial<{
    status: RunStatus;
    stage: RunStage | null;
    progress: number;
    iterations: RunIteration[];
    error: string | null;
    cancelRequested: boolean;
    started: boolean;
    finished: boolean;
    plan: string | null;
    /** Appends { stage, at } to the run's stage log. */
    logStage: RunStage;
  }>,
  db: Db = defaultDb,
): Promise<void> {
  const row: Record<string, unknown> = { updated_at: db.fn.now() };
  if (changes.status !== undefined) row.status = changes.status;
  if (changes.stage !== undefined) row.stage = changes.stage;
  if (changes.progress !== undefined) row.progress = changes.progress;
  if (changes.iterations !== undefined) row.iterations = JSON.stringify(changes.iterations);
  if (changes.error !== undefined) row.error = changes.error;
  if (changes.cancelRequested !== undefined) row.cancel_requested = changes.cancelRequested;
  if (changes.started) row.started_at = db.raw("coalesce(started_at, now())");
  if (changes.finished) row.finished_at = db.fn.now();
  if (changes.plan !== undefined) row.plan = changes.plan;
  if (changes.logStage !== undefined) row.log = db.raw("log || ?::jsonb", [JSON.stringify([{ stage: changes.logStage, at: new Date().toISOString() }])]);
  await db("training_runs").where({ organization_id: organizationId, id: runId }).update(row);
}

export async function findRunPlan(organizationId: string, runId: string, db: Db = defaultDb): Promise<string | null> {
  const r = await db("training_runs").where({ organization_id: organizationId, id: runId }).first("plan");
  return r ? ((r.plan as string | null) ?? null) : null;
}

/** A document a run uses: its role, order, shard and the gold version it reads. */
export type RunDocument = { documentId: string; role: RunDocumentRole; position: number; goldVersion: number | null; shard: number; tokens: number };

export async function insertRunDocuments(organizationId: string, runId: string, docs: RunDocument[], db: Db): Promise<void> {
  const rows = docs.map((d) => ({
    run_id: runId,
    organization_id: organizationId,
    document_id: d.documentId,
    role: d.role,
    position: d.position,
    gold_version: d.goldVersion,
    shard: d.shard,
  }));
  for (let i = 0; i < rows.length; i += 1000) await db("training_run_documents").insert(rows.slice(i, i + 1000));
}

export async function listRunDocuments(organizationId: string, runId: string, db: Db = defaultDb): Promise<RunDocument[]> {
  const rows = await db("training_run_documents")
    .where({ organization_id: organizationId, run_id: runId })
    .orderBy([{ column: "role" }, { column: "position" }])
    .select("document_id", "role", "position", "gold_version", "shard");
  return rows.map((r) => ({ documentId: r.document_id, role: r.role, position: r.position, goldVersion: r.gold_version, shard: r.shard, tokens: 0 }));
}

export async function insertShards(organizationId: string, runId: string, shards: { shard: number; documents: number; tokens: number }[], db: Db): Promise<void> {
  if (!shards.length) return;
  await db("training_run_shards").insert(
    shards.map((s) => ({ run_id: runId, organization_id: organizationId, shard: s.shard, document_count: s.documents, token_count: s.tokens })),
  );
}

/** Forgets every shard's counts (a retried loading job starts pass 2 over). */
export async function clearShardCounts(organizationId: string, runId: string, db: Db = defaultDb): Promise<void> {
  await db("training_run_shards").where({ organization_id: organizationId, run_id: runId }).update({ statistics: null, finished_at: null });
}

export async function storeShardCounts(organizationId: string, runId: string, shard: number, counts: string, db: Db = defaultDb): Promise<void> {
  await db("training_run_shards")
    .where({ organization_id: organizationId, run_id: runId, shard })
    .update({ statistics: Buffer.from(counts, "utf8"), finished_at: db.fn.now() });
}

/** Shards counted so far and in all. */
export async function countFinishedShards(organizationId: string, runId: string, db: Db = defaultDb): Promise<{ finished: number; total: number }> {
  const r = await db("training_run_shards")
    .where({ organization_id: organizationId, run_id: runId })
    .select(db.raw("count(*)::int AS total"), db.raw("count(statistics)::int AS finished"))
    .first();
  return { finished: r?.finished ?? 0, total: r?.total ?? 0 };
}

/** A candidate document of a new run: gold or not, split, gold version, tokens. */
export type CorpusDocumentForRun = { id: string; split: "train" | "test" | null; gold: boolean; goldVersion: number | null; tokens: number };

/**
 * The corpus's documents that have tokens, in upload order (the order exports use), with their
 * gold version. Reads the documents feature's tables read-only: a run records what it will read.
 */
export async function listCorpusDocumentsForRun(organizationId: string, corpusId: string, db: Db = defaultDb): Promise<CorpusDocumentForRun[]> {
  const rows = await db("documents as d")
    .leftJoin("document_gold as g", "g.document_id", "d.id")
    .leftJoin("upload_files as f", "f.id", "d.upload_file_id")
    .where({ "d.organization_id": organizationId, "d.corpus_id": corpusId })
    .andWhere("d.token_count", ">", 0)
    .select("d.id", "d.split", "d.annotation_status", "g.version", "d.token_count")
    .orderBy([{ column: "d.created_at" }, { column: "f.file_index" }, { column: "d.source_index" }, { column: "d.id" }]);
  return rows.map((r) => ({
    id: r.id,
    split: r.split,
    gold: r.annotation_status === "gold" && r.version !== null,
    goldVersion: r.version ?? null,
    tokens: r.token_count,
  }));
}

/** A document row as a run reads it: text, tokens, sentences and (for gold roles) spans with their version now. */
export type RunDocumentRow = {
  documentId: string;
  title: string;
  text: string;
  starts: number[];
  ends: number[];
  sentenceStarts: number[];
  spans: { start: number; end: number; typeId: string }[];
  goldVersion: number | null;
  recordedVersion: number | null;
};

/**
 * The run's documents of one role (optionally one shard) in run order, streamed from a
 * server-side cursor so that memory holds a few rows whatever the run's size. A document deleted
 * since the run started is missing from the stream; callers compare counts.
 */
export function streamRunDocuments(
  organizationId: string,
  runId: string,
  role: RunDocumentRole,
  shard: number | null,
  db: Db = defaultDb,
): AsyncIterable<RunDocumentRow> {
  const q = db("training_run_documents as rd")
    .join("documents as d", "d.id", "rd.document_id")
    .join("document_tokens as t", "t.document_id", "d.id")
    .leftJoin("document_gold as g", "g.document_id", "d.id")
    .where({ "rd.organization_id": organizationId, "rd.run_id": runId, "rd.role": role, "d.organization_id": organizationId })
    .select("d.id", "d.title", "d.text", "t.starts", "t.ends", "t.sentence_starts", "g.spans", "g.version", "rd.gold_version")
    .orderBy("rd.position");
  if (shard !== null) q.andWhere("rd.shard", shard);
  const stream = q.stream({ highWaterMark: 50 }) as unknown as AsyncIterable<Raw>;
  return (async function* () {
    for await (const r of stream) {
      yield {
        documentId: r.id as string,
        title: r.title as string,
        text: r.text as string,
        starts: r.starts as number[],
        ends: r.ends as number[],
        sentenceStarts: r.sentence_starts as number[],
        spans: (r.spans as RunDocumentRow["spans"] | null) ?? [],
        goldVersion: (r.version as number | null) ?? null,
        recordedVersion: (r.gold_version as number | null) ?? null,
      };
    }
  })();
}

/** Ids of a run's test documents in run order. */
export async function listRunTestDocumentIds(organizationId: string, runId: string, db: Db = defaultDb): Promise<string[]> {
  const rows = await db("training_run_documents").where({ organization_id: organizationId, run_id: runId, role: "test" }).orderBy("position").select("document_id");
  return rows.map((r) => r.document_id as string);
}

/** Documents per shard, in shard order. */
export async function listShardSizes(organizationId: string, runId: string, db: Db = defaultDb): Promise<number[]> {
  const rows = await db("training_run_shards").where({ organization_id: organizationId, run_id: runId }).orderBy("shard").select("document_count");
  return rows.map((r) => r.document_count as number);
}

/** One shard's counts (null until counted). */
export async function findShardCounts(organizationId: string, runId: string, shard: number, db: Db = defaultDb): Promise<string | null> {
  const r = await db("training_run_shards").where({ organization_id: organizationId, run_id: runId, shard }).first("statistics");
  return r?.statistics ? (r.statistics as Buffer).toString("utf8") : null;
}
