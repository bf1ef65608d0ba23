import type { Evaluation } from "@tagloom/contracts";
import { db as defaultDb } from "@/db/knex";
import { type Db, iso } from "@/db/types";

/** A tagger row without its model text (which may be megabytes). */
export type TaggerRow = {
  id: string;
  organizationId: string;
  corpusId: string;
  runId: string | null;
  version: number;
  modelSha256: string;
  evaluation: Evaluation;
  createdAt: string;
  /** created_at as PostgreSQL text, exact to the microsecond (page cursors). */
  cursorAt: string;
};

type Raw = {
  id: string;
  organization_id: string;
  corpus_id: string;
  run_id: string | null;
  version: number;
  model_sha256: string;
  evaluation: Evaluation;
  created_at: Date;
  cursor_at: string;
};

const toRow = (r: Raw): TaggerRow => ({
  id: r.id,
  organizationId: r.organization_id,
  corpusId: r.corpus_id,
  runId: r.run_id,
  version: r.version,
  modelSha256: r.model_sha256,
  evaluation: r.evaluation,
  createdAt: iso(r.created_at)!,
  cursorAt: r.cursor_at,
});

const columns = (db: Db) => [
  "id",
  "organization_id",
  "corpus_id",
  "run_id",
  "version",
  "model_sha256",
  "evaluation",
  "created_at",
  db.raw("created_at::text AS cursor_at"),
];

export async function findTagger(organizationId: string, corpusId: string, taggerId: string, db: Db = defaultDb): Promise<TaggerRow | null> {
  const r = await db("taggers").where({ organization_id: organizationId, corpus_id: corpusId, id: taggerId }).first(columns(db));
  return r ? toRow(r) : null;
}

export async function findTaggerOfRun(organizationId: string, runId: string, db: Db = defaultDb): Promise<TaggerRow | null> {
  const r = await db("taggers").where({ organization_id: organizationId, run_id: runId }).first(columns(db));
  return r ? toRow(r) : null;
}

/** The model exactly as stored (serializeModel's output), or null. */
export async function findTaggerModelText(organizationId: string, corpusId: string, taggerId: string, db: Db = defaultDb): Promise<string | null> {
  const r = await db("taggers").where({ organization_id: organizationId, corpus_id: corpusId, id: taggerId }).first("model");
  return r ? (r.model as string) : null;
}

/** Newest version first; `after` is the last row of the previous page. */
export async function listTaggerRows(
  organizationId: string,
  corpusId: string,
  options: { limit: number; afterVersion?: number | undefined },
  db: Db = defaultDb,
): Promise<TaggerRow[]> {
  const q = db("taggers").where({ organization_id: organizationId, corpus_id: corpusId }).select(columns(db));
  if (options.afterVersion !== undefined) q.andWhere("version", "<", options.afterVersion);
  const rows = await q.orderBy("version", "desc").limit(options.limit);
  return rows.map(toRow);
}

/**
 * Inserts a tagger with the corpus's next version number. Call inside a transaction that holds
 * the corpus row lock (lockCorpus), so that concurrent inserts queue for the number.
 */
export async function insertTaggerRow(
  row: { organizationId: string; corpusId: string; runId: string | null; modelText: string; modelSha256: string; evaluation: Evaluation },
  db: Db,
): Promise<TaggerRow> {
  const next = await db("taggers").where({ corpus_id: row.corpusId }).max<{ max: number | null }[]>({ max: "version" });
  const version = (next[0]?.max ?? 0) + 1;
  const [r] = await db("taggers")
    .insert({
      organization_id: row.organizationId,
      corpus_id: row.corpusId,
      run_id: row.runId,
      version,
      model: row.modelText,
      model_sha256: row.modelSha256,
      evaluation: JSON.stringify(row.evaluation),
    })
    .returning(columns(db));
  return toRow(r);
}
