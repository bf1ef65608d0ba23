import type { AssignmentState, SpanOrigin } from "@tagloom/contracts";
import { db as defaultDb } from "@/db/knex";
import type { Db } from "@/db/types";

/** A span as stored: the entity type by id, so that renaming a type keeps its spans. */
export type StoredSpan = { start: number; end: number; typeId: string; origin?: SpanOrigin };

export type AssignmentRow = {
  id: string;
  organizationId: string;
  corpusId: string;
  batchId: string;
  documentId: string;
  annotatorId: string;
  state: AssignmentState;
  spans: StoredSpan[];
  dismissedSuggestions: StoredSpan[];
  version: number;
  reviewComment: string | null;
  reviewedBy: string | null;
  reviewedAt: Date | null;
  startedAt: Date | null;
  submittedAt: Date | null;
  createdAt: Date;
  updatedAt: Date;
};

/** The row without its spans, for lists. */
export type AssignmentHead = Omit<AssignmentRow, "spans" | "dismissedSuggestions">;

const EDITABLE = ["open", "in_progress", "returned"];

const headColumns = [
  "id",
  "organization_id",
  "corpus_id",
  "batch_id",
  "document_id",
  "annotator_id",
  "state",
  "version",
  "review_comment",
  "reviewed_by",
  "reviewed_at",
  "started_at",
  "submitted_at",
  "created_at",
  "updated_at",
];
const allColumns = [...headColumns, "spans", "dismissed_suggestions"];

// eslint-disable-next-line @typescript-eslint/no-explicit-any
const toHead = (r: any): AssignmentHead => ({
  id: r.id,
  organizationId: r.organization_id,
  corpusId: r.corpus_id,
  batchId: r.batch_id,
  documentId: r.document_id,
  annotatorId: r.annotator_id,
  state: r.state,
  version: r.version,
  reviewComment: r.review_comment,
  reviewedBy: r.reviewed_by,
  reviewedAt: r.reviewed_at,
  startedAt: r.started_at,
  submittedAt: r.submitted_at,
  createdAt: r.created_at,
  updatedAt: r.updated_at,
});
// eslint-disable-next-line @typescript-eslint/no-explicit-any
const toRow = (r: any): AssignmentRow => ({ ...toHead(r), spans: r.spans ?? [], dismissedSuggestions: r.dismissed_suggestions ?? [] });

export async function insertAssignments(
  rows: Array<{ organizationId: string; corpusId: string; batchId: string; documentId: string; annotatorId: string }>,
  db: Db = defaultDb,
): Promise<void> {
  for (let i = 0; i < rows.length; i += 1000) {
    await db("assignments").insert(
      rows.slice(i, i + 1000).map((r) => ({
        organization_id: r.organizationId,
        corpus_id: r.corpusId,
        batch_id: r.batchId,
        document_id: r.documentId,
        annotator_id: r.annotatorId,
      })),
    );
  }
}

export async function findAssignment(organizationId: string, id: string, db: Db = defaultDb, lock = false): Promise<AssignmentRow | null> {
  const q = db("assignments").where({ organization_id: organizationId, id }).first(allColumns);
  if (lock) q.forUpdate();
  const r = await q;
  return r ? toRow(r) : null;
}

/** The fields of an assignment that never change, or null. */
export async function findAssignmentFacts(
  organizationId: string,
  id: string,
  db: Db = defaultDb,
): Promise<{ organizationId: string; corpusId: string; documentId: string; annotatorId: string } | null> {
  const r = await db("assignments").where({ organization_id: organizationId, id }).first("organization_id", "corpus_id", "document_id", "annotator_id");
  return r ? { organizationId: r.organization_id, corpusId: r.corpus_id, documentId: r.document_id, annotatorId: r.annotator_id } : null;
}

/**
 * Replaces the spans only if the row still has `expectedVersion` and is editable, in one
 * statement: of several saves naming the same version exactly one changes the row. An open
 * assignment becomes in progress. Returns the new head, or null when nothing was changed.
 */
export async function saveAssignmentSpans(
  organizationId: string,
  id: string,
  annotatorId: string,
  expectedVersion: number,
  spans: StoredSpan[],
  dismissed: StoredSpan[],
  db: Db = defaultDb,
): Promise<AssignmentHead | null> {
  const [r] = await db("assignments")
    .where({ organization_id: organizationId, id, annotator_id: annotatorId, version: expectedVersion })
    .whereIn("state", EDITABLE)
    .update({
      spans: JSON.stringify(spans),
      dismissed_suggestions: JSON.stringify(dismissed),
      version: db.raw("version + 1"),
      state: db.raw("CASE WHEN state = 'open' THEN 'in_progress' ELSE state END"),
      started_at: db.raw("coalesce(started_at, now())"),
      updated_at: db.fn.now(),
    })
    .returning(headColumns);
  return r ? toHead(r) : null;
}

/** Moves an editable assignment at `expectedVersion` to submitted; null when it was not. */
export async function markSubmitted(organizationId: string, id: string, annotatorId: string, expectedVersion: number, db: Db): Promise<AssignmentHead | null> {
  const [r] = await db("assignments")
    .where({ organization_id: organizationId, id, annotator_id: annotatorId, version: expectedVersion })
    .whereIn("state", EDITABLE)
    .update({ state: "submitted", submitted_at: db.fn.now(), updated_at: db.fn.now(), version: db.raw("version + 1") })
    .returning(headColumns);
  return r ? toHead(r) : null;
}

/** Review outcome of submitted assignments (accepted, or returned with a comment). */
export async function markReviewed(
  organizationId: string,
  ids: string[],
  outcome: { state: "accepted" | "returned"; comment: string | null; reviewerId: string },
  db: Db,
): Promise<void> {
  if (!ids.length) return;
  await db("assignments")
    .where({ organization_id: organizationId })
    .whereIn("id", ids)
    .update({
      state: outcome.state,
      review_comment: outcome.comment,
      reviewed_by: outcome.reviewerId,
      reviewed_at: db.fn.now(),
      updated_at: db.fn.now(),
      version: db.raw("version + 1"),
    });
}

export async function listAssignmentHeadsOfBatch(organizationId: string, batchId: string, db: Db = defaultDb): Promise<AssignmentHead[]> {
  const rows = await db("assignments")
    .where({ organization_id: organizationId, batch_id: batchId })
    .orderBy([{ column: "created_at" }, { column: "id" }])
    .select(headColumns);
  return rows.map(toHead);
}

/** The assignments of one document in one batch, with spans (locked when asked). */
export async function listAssignmentsOfBatchDocument(
  organizationId: string,
  batchId: string,
  documentId: string,
  db: Db = defaultDb,
  lock = false,
): Promise<AssignmentRow[]> {
  const q = db("assignments")
    .where({ organization_id: organizationId, batch_id: batchId, document_id: documentId })
    .orderBy([{ column: "created_at" }, { column: "id" }])
    .select(allColumns);
  if (lock) q.forUpdate();
  return (await q).map(toRow);
}

/** Finished (submitted or accepted) assignments of a batch, with spans, for agreement. */
export async function listFinishedAssignmentsOfBatch(organizationId: string, batchId: string, db: Db = defaultDb): Promise<AssignmentRow[]> {
  const rows = await db("assignments")
    .where({ organization_id: organizationId, batch_id: batchId })
    .whereIn("state", ["submitted", "accepted"])
    .orderBy([{ column: "document_id" }, { column: "id" }])
    .select(allColumns);
  return rows.map(toRow);
}

/** A member's unfinished assignments, oldest first. */
export async function listQueueHeads(organizationId: string, annotatorId: string, db: Db = defaultDb): Promise<AssignmentHead[]> {
  const rows = await db("assignments")
    .where({ organization_id: organizationId, annotator_id: annotatorId })
    .whereIn("state", EDITABLE)
    .orderBy([{ column: "created_at" }, { column: "id" }])
    .limit(1000)
    .select(headColumns);
  return rows.map(toHead);
}

/** A member's finished assignments (submitted or accepted), the most recently changed first. */
export async function listDoneHeads(organizationId: string, annotatorId: string, limit: number, db: Db = defaultDb): Promise<AssignmentHead[]> {
  const rows = await db("assignments")
    .where({ organization_id: organizationId, annotator_id: annotatorId })
    .whereIn("state", ["submitted", "accepted"])
    .orderBy([{ column: "updated_at", order: "desc" }, { column: "id" }])
    .limit(limit)
    .select(headColumns);
  return rows.map(toHead);
}

/** Documents of the organization (optionally one corpus or batch) that have a submitted assignment, with all their assignments. */
export async function listReviewHeads(
  organizationId: string,
  filter: { corpusId?: string | undefined; batchId?: string | undefined },
  db: Db = defaultDb,
): Promise<AssignmentHead[]> {
  const q = db("assignments as a")
    .where("a.organization_id", organizationId)
    .whereExists(function () {
      this.select(db.raw("1"))
        .from("assignments as s")
        .whereRaw("s.batch_id = a.batch_id AND s.document_id = a.document_id AND s.organization_id = a.organization_id")
        .where("s.state", "submitted");
    });
  if (filter.corpusId) q.where("a.corpus_id", filter.corpusId);
  if (filter.batchId) q.where("a.batch_id", filter.batchId);
  const rows = await q
    .orderBy([{ column: "a.batch_id" }, { column: "a.document_id" }, { column: "a.created_at" }])
    .limit(5000)
    .select(headColumns.map((c) => `a.${c}`));
  return rows.map(toHead);
}

export type StateCount = { batchId: string; annotatorId: string; state: AssignmentState; count: number };

/** Assignment counts per batch, annotator and state. */
export async function countAssignmentStates(organizationId: string, batchIds: string[], db: Db = defaultDb): Promise<StateCount[]> {
  if (!batchIds.length) return [];
  const rows = await db("assignments")
    .where({ organization_id: organizationId })
    .whereIn("batch_id", batchIds)
    .groupBy("batch_id", "annotator_id", "state")
    .select("batch_id", "annotator_id", "state", db.raw("count(*)::int AS count"));
  return rows.map((r: { batch_id: string; annotator_id: string; state: AssignmentState; count: number }) => ({
    batchId: r.batch_id,
    annotatorId: r.annotator_id,
    state: r.state,
    count: r.count,
  }));
}

/** Per batch: how many documents it holds and how many have all their assignments accepted. */
export async function countBatchDocuments(
  organizationId: string,
  batchIds: string[],
  db: Db = defaultDb,
): Promise<Map<string, { documents: number; settled: number }>> {
  const out = new Map<string, { documents: number; settled: number }>();
  if (!batchIds.length) return out;
  const rows = await db
    .from(
      db("assignments")
        .where({ organization_id: organizationId })
        .whereIn("batch_id", batchIds)
        .groupBy("batch_id", "document_id")
        .select("batch_id", db.raw("bool_and(state = 'accepted') AS settled"))
        .as("d"),
    )
    .groupBy("batch_id")
    .select("batch_id", db.raw("count(*)::int AS documents"), db.raw("count(*) FILTER (WHERE settled)::int AS settled"));
  for (const r of rows as Array<{ batch_id: string; documents: number; settled: number }>) out.set(r.batch_id, { documents: r.documents, settled: r.settled });
  return out;
}

/** True when every assignment of the document (in any batch) is submitted or accepted. */
export async function allAssignmentsOfDocumentFinished(organizationId: string, documentId: string, db: Db = defaultDb): Promise<boolean> {
  const r = await db("assignments")
    .where({ organization_id: organizationId, document_id: documentId })
    .whereIn("state", EDITABLE)
    .first(db.raw("1 AS x"));
  return !r;
}

/**
 * Removes an entity type's spans (and dismissed suggestions) from every assignment,
 * when the type is deleted; returns how many assignments changed. Their versions grow so that an
 * open workspace's next save gets a 409 and reloads.
 */
export async function removeTypeFromAssignments(organizationId: string, typeId: string, db: Db = defaultDb): Promise<number> {
  const r = await db.raw(
    `UPDATE assignments SET
       spans = coalesce((SELECT jsonb_agg(e) FROM jsonb_array_elements(spans) e WHERE e->>'typeId' <> :typeId), '[]'::jsonb),
       dismissed_suggestions = coalesce((SELECT jsonb_agg(e) FROM jsonb_array_elements(dismissed_suggestions) e WHERE e->>'typeId' <> :typeId), '[]'::jsonb),
       version = version + 1,
       updated_at = now()
     WHERE organization_id = :organizationId
       AND (spans @> jsonb_build_array(jsonb_build_object('typeId', :typeId::text))
            OR dismissed_suggestions @> jsonb_build_array(jsonb_build_object('typeId', :typeId::text)))`,
    { organizationId, typeId },
  );
  return r.rowCount ?? 0;
}

/** How many spans of an entity type the assignments hold (before a delete), and in how many documents. */
export async function countTypeInAssignments(organizationId: string, typeId: string, db: Db = defaultDb): Promise<{ spans: number; documents: number }> {
  const r = await db.raw(
    `SELECT count(*)::int AS spans, count(DISTINCT a.document_id)::int AS documents
     FROM assignments a, jsonb_array_elements(a.spans) e
     WHERE a.organization_id = ? AND e->>'typeId' = ?`,
    [organizationId, typeId],
  );
  return r.rows[0] ?? { spans: 0, documents: 0 };
}
