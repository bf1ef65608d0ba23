import { createHash } from "node:crypto";
import { type Evaluation, type Page, type Tagger, type TaggerListQuery, taggerLabel } from "@tagloom/contracts";
import { type Actor, recordAudit } from "@/audit/audit.service";
import { getCorpus } from "@/corpora/corpora.service";
import { decodePageCursor, encodePageCursor } from "@/corpora/page-cursor";
import { db as defaultDb } from "@/db/knex";
import { type Db, isUuid } from "@/db/types";
import { NotFoundError } from "@/errors";
import { type TaggerRow, findTagger, findTaggerModelText, findTaggerOfRun, insertTaggerRow, listTaggerRows } from "./taggers.repository";

const toTagger = (row: TaggerRow, corpusName: string): Tagger => ({
  id: row.id,
  corpusId: row.corpusId,
  version: row.version,
  runId: row.runId,
  createdAt: row.createdAt,
  label: taggerLabel(row.version, corpusName),
  evaluation: row.evaluation,
});

/** The tagger of the corpus; NotFoundError when it is missing or another organization's. */
export async function getTagger(organizationId: string, corpusId: string, taggerId: string, db?: Db): Promise<Tagger> {
  const corpus = await getCorpus(organizationId, corpusId, db);
  if (!isUuid(taggerId)) throw new NotFoundError("tagger");
  const row = await findTagger(organizationId, corpusId, taggerId, db);
  if (!row) throw new NotFoundError("tagger");
  return toTagger(row, corpus.name);
}

/** The tagger a run stored, or null (run still going, failed or cancelled). */
export async function findTaggerOfRunId(organizationId: string, runId: string, db?: Db): Promise<{ id: string; version: number } | null> {
  const row = await findTaggerOfRun(organizationId, runId, db);
  return row ? { id: row.id, version: row.version } : null;
}

/**
 * The model JSON exactly as the run's serializeModel wrote it: the file the CLI's `tag --model`
 * reads and `loadModel` parses. NotFoundError as getTagger.
 */
export async function getTaggerModelText(organizationId: string, corpusId: string, taggerId: string, db?: Db): Promise<string> {
  await getCorpus(organizationId, corpusId, db);
  if (!isUuid(taggerId)) throw new NotFoundError("tagger");
  const text = await findTaggerModelText(organizationId, corpusId, taggerId, db);
  if (text === null) throw new NotFoundError("tagger");
  return text;
}

/** The corpus's taggers, newest version first, paginated by version. */
export async function listTaggers(organizationId: string, corpusId: string, query: TaggerListQuery): Promise<Page<Tagger>> {
  const corpus = await getCorpus(organizationId, corpusId);
  const after = decodePageCursor(query.cursor, "integer");
  const rows = await listTaggerRows(organizationId, corpusId, { limit: query.limit + 1, afterVersion: after ? Number(after.value) : undefined });
  const more = rows.length > query.limit;
  const page = more ? rows.slice(0, query.limit) : rows;
  const last = page[page.length - 1];
  return { items: page.map((r) => toTagger(r, corpus.name)), nextCursor: more && last ? encodePageCursor(last.version, last.id) : null };
}

/** Scores of a tagger that was stored without a run (fixtures, imports): nothing was evaluated. */
export function evaluationOfNothing(): Evaluation {
  return {
    overall: { precision: 0, recall: 0, f1: 0, correct: 0, predicted: 0, gold: 0 },
    types: [],
    tokenAccuracy: 0,
    tokens: 0,
    sentences: 0,
    documents: 0,
    confusion: { types: [], counts: [], missed: [], spurious: [] },
    crossValidation: null,
    learningCurve: [],
    semiSupervised: null,
  };
}

/**
 * Stores a tagger as the corpus's next version. `modelText` is serializeModel's output and is kept
 * byte for byte. Used by the storing stage of a run (with its runId) and by test fixtures (runId
 * null, evaluation omitted = evaluationOfNothing). Runs inside `db` when it is a transaction.
 */
export async function insertTagger(
  input: { organizationId: string; corpusId: string; runId?: string | null; modelText: string; evaluation?: Evaluation },
  db: Db = defaultDb,
): Promise<Tagger> {
  const corpus = await getCorpus(input.organizationId, input.corpusId, db);
  const store = async (trx: Db) => {
    // Version numbers per corpus: concurrent inserts for one corpus queue on this lock.
    await trx.raw("SELECT pg_advisory_xact_lock(hashtext(?))", [`taggers:${input.corpusId}`]);
    return insertTaggerRow(
      {
        organizationId: input.organizationId,
        corpusId: input.corpusId,
        runId: input.runId ?? null,
        modelText: input.modelText,
        modelSha256: createHash("sha256").update(input.modelText, "utf8").digest("hex"),
        evaluation: input.evaluation ?? evaluationOfNothing(),
      },
      trx,
    );
  };
  const row = "isTransaction" in db && db.isTransaction ? await store(db) : await defaultDbTransaction(db, store);
  return toTagger(row, corpus.name);
}

function defaultDbTransaction<T>(db: Db, work: (trx: Db) => Promise<T>): Promise<T> {
  return (db as typeof defaultDb).transaction(work);
}

function fileSlug(label: string): string {
  return label.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-+|-+$/g, "").slice(0, 80) || "tagger";
}

/** The model JSON for download (byte for byte as stored), recorded in the audit log. */
export async function downloadTaggerModel(
  organizationId: string,
  corpusId: string,
  taggerId: string,
  actor: Actor,
): Promise<{ filename: string; text: string }> {
  const tagger = await getTagger(organizationId, corpusId, taggerId);
  const text = await getTaggerModelText(organizationId, corpusId, taggerId);
  await recordAudit(undefined, actor, organizationId, "tagger.downloaded", { type: "tagger", id: tagger.id, label: tagger.label }, { file: "model" });
  return { filename: `${fileSlug(tagger.label)}.json`, text };
}

/** The tagger's evaluation as a JSON file, recorded in the audit log. */
export async function downloadTaggerEvaluation(
  organizationId: string,
  corpusId: string,
  taggerId: string,
  actor: Actor,
): Promise<{ filename: string; text: string }> {
  const tagger = await getTagger(organizationId, corpusId, taggerId);
  await recordAudit(undefined, actor, organizationId, "tagger.downloaded", { type: "tagger", id: tagger.id, label: tagger.label }, { file: "evaluation" });
  const body = { tagger: { id: tagger.id, label: tagger.label, version: tagger.version, runId: tagger.runId, createdAt: tagger.createdAt }, evaluation: tagger.evaluation };
  return { filename: `${fileSlug(tagger.label)}-evaluation.json`, text: `${JSON.stringify(body, null, 2)}\n` };
}
