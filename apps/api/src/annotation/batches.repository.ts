import { db as defaultDb } from "@/db/knex";
import type { Db } from "@/db/types";

export type BatchRow = {
  id: string;
  organizationId: string;
  corpusId: string;
  name: string;
  /** YYYY-MM-DD (DATE columns are read as text). */
  dueDate: string | null;
  annotatorsPerDocument: number;
  createdBy: string | null;
  createdAt: Date;
};

const columns = ["id", "organization_id", "corpus_id", "name", "due_date", "annotators_per_document", "created_by", "created_at"];

// eslint-disable-next-line @typescript-eslint/no-explicit-any
const toRow = (r: any): BatchRow => ({
  id: r.id,
  organizationId: r.organization_id,
  corpusId: r.corpus_id,
  name: r.name,
  dueDate: r.due_date,
  annotatorsPerDocument: r.annotators_per_document,
  createdBy: r.created_by,
  createdAt: r.created_at,
});

export async function insertBatch(
  b: { organizationId: string; corpusId: string; name: string; dueDate: string | null; annotatorsPerDocument: number; createdBy: string },
  db: Db = defaultDb,
): Promise<BatchRow> {
  const [r] = await db("batches")
    .insert({
      organization_id: b.organizationId,
      corpus_id: b.corpusId,
      name: b.name,
      due_date: b.dueDate,
      annotators_per_document: b.annotatorsPerDocument,
      created_by: b.createdBy,
    })
    .returning(columns);
  return toRow(r);
}

/** A batch of the organization (and of the corpus when given). */
export async function findBatch(organizationId: string, id: string, corpusId?: string, db: Db = defaultDb): Promise<BatchRow | null> {
  const q = db("batches").where({ organization_id: organizationId, id });
  if (corpusId) q.where({ corpus_id: corpusId });
  const r = await q.first(columns);
  return r ? toRow(r) : null;
}

export async function findBatchesByIds(organizationId: string, ids: string[], db: Db = defaultDb): Promise<BatchRow[]> {
  if (!ids.length) return [];
  const rows = await db("batches").where({ organization_id: organizationId }).whereIn("id", ids).select(columns);
  return rows.map(toRow);
}

/** Newest first; `before` is the last row of the previous page. */
export async function listBatches(
  organizationId: string,
  options: { corpusId?: string | undefined; limit: number; before?: { createdAt: string; id: string } | undefined },
  db: Db = defaultDb,
): Promise<BatchRow[]> {
  const q = db("batches").where({ organization_id: organizationId });
  if (options.corpusId) q.where({ corpus_id: options.corpusId });
  if (options.before) q.andWhereRaw("(created_at, id) < (?::timestamptz, ?::uuid)", [options.before.createdAt, options.before.id]);
  const rows = await q
    .orderBy([{ column: "created_at", order: "desc" }, { column: "id", order: "desc" }])
    .limit(options.limit)
    .select(columns);
  return rows.map(toRow);
}

export async function deleteBatch(organizationId: string, id: string, db: Db): Promise<void> {
  await db("batches").where({ organization_id: organizationId, id }).delete();
}
