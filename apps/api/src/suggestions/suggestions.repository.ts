import type { SuggestionRun } from "@tagloom/contracts";
import { db as defaultDb } from "@/db/knex";
import { type Db, iso } from "@/db/types";

// The suggester's data: the corpus's suggester columns, suggestion runs, the tagger's rows of
// document_suggestions (imported suggestions are left alone), document_uncertainty and the
// annotators' decisions on tagger suggestions.

export type StoredSuggestion = { start: number; end: number; typeId: string; confidence: number };
export type SuggesterRow = { taggerId: string | null; changedAt: Date | null; runId: string | null };

export async function findSuggester(organizationId: string, corpusId: string, db: Db = defaultDb): Promise<SuggesterRow | null> {
  const r = await db("corpora").where({ organization_id: organizationId, id: corpusId }).first("suggester_tagger_id", "suggester_changed_at", "suggester_run_id");
  return r ? { taggerId: r.suggester_tagger_id, changedAt: r.suggester_changed_at, runId: r.suggester_run_id } : null;
}

export async function updateSuggester(organizationId: string, corpusId: string, taggerId: string | null, runId: string | null, db: Db): Promise<void> {
  await db("corpora")
    .where({ organization_id: organizationId, id: corpusId })
    .update({ suggester_tagger_id: taggerId, suggester_run_id: runId, suggester_changed_at: db.fn.now() });
}

/** Removes the tagger's suggestions and scores of the corpus (suggestions from imports stay). */
export async function deleteTaggerSuggestions(organizationId: string, corpusId: string, db: Db): Promise<number> {
  const n = await db("document_suggestions as s")
    .where({ "s.organization_id": organizationId, "s.source": "tagger" })
    .whereIn("s.document_id", db("documents").where({ organization_id: organizationId, corpus_id: corpusId }).select("id"))
    .delete();
  await db("document_uncertainty").where({ organization_id: organizationId, corpus_id: corpusId }).delete();
  return n;
}

/** Ids of the corpus's documents without gold, in creation order (optionally only those of some uploaded files). */
export async function listDocumentIdsWithoutGold(organizationId: string, corpusId: string, db: Db = defaultDb, fromFiles?: string[]): Promise<string[]> {
  const q = db("documents")
    .where({ organization_id: organizationId, corpus_id: corpusId })
    .whereNot("annotation_status", "gold")
    .orderBy([{ column: "created_at" }, { column: "id" }])
    .pluck("id");
  if (fromFiles) q.whereIn("upload_file_id", fromFiles);
  return q;
}

export async function insertRun(
  r: { organizationId: string; corpusId: string; taggerId: string; reason: SuggestionRun["reason"]; shardsTotal: number; documentsTotal: number; createdBy: string | null },
  db: Db,
): Promise<string> {
  const [row] = await db("suggestion_runs")
    .insert({
      organization_id: r.organizationId,
      corpus_id: r.corpusId,
      tagger_id: r.taggerId,
      reason: r.reason,
      shards_total: r.shardsTotal,
      documents_total: r.documentsTotal,
      created_by: r.createdBy,
      finished_at: r.shardsTotal === 0 ? db.fn.now() : null,
    })
    .returning("id");
  return row.id as string;
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
const toRun = (r: any): SuggestionRun => ({
  id: r.id,
  taggerId: r.tagger_id,
  reason: r.reason,
  shardsTotal: r.shards_total,
  shardsDone: r.shards_done,
  documentsTotal: r.documents_total,
  documentsDone: r.documents_done,
  spansSuggested: r.spans_suggested,
  createdAt: iso(r.created_at)!,
  finishedAt: iso(r.finished_at),
});

export async function listRecentRuns(organizationId: string, corpusId: string, limit = 5, db: Db = defaultDb): Promise<SuggestionRun[]> {
  const rows = await db("suggestion_runs")
    .where({ organization_id: organizationId, corpus_id: corpusId })
    .orderBy([{ column: "created_at", order: "desc" }, { column: "id", order: "desc" }])
    .limit(limit);
  return rows.map(toRun);
}

export type ShardDocument = { id: string; text: string; starts: number[]; ends: number[]; sentenceStarts: number[] };

export async function loadShardDocuments(organizationId: string, documentIds: string[], db: Db = defaultDb): Promise<ShardDocument[]> {
  const rows = await db("documents as d")
    .join("document_tokens as t", "t.document_id", "d.id")
    .where("d.organization_id", organizationId)
    .whereIn("d.id", documentIds)
    .whereNot("d.annotation_status", "gold")
    .select("d.id", "d.text", "t.starts", "t.ends", "t.sentence_starts");
  return rows.map((r) => ({ id: r.id, text: r.text, starts: r.starts, ends: r.ends, sentenceStarts: r.sentence_starts }));
}

/** Takes a share lock on the corpus row and tells whether `taggerId` is still its suggester. */
export async function isCurrentSuggester(organizationId: string, corpusId: string, taggerId: string, db: Db): Promise<boolean> {
  const r = await db("corpora").where({ organization_id: organizationId, id: corpusId }).forShare().first("suggester_tagger_id");
  return r?.suggester_tagger_id === taggerId;
}

export type ShardResult = {
  documentId: string;
  spans: StoredSuggestion[];
  meanEntropy: number;
  leastConfidence: number;
  spanConfidences: number[];
};

/**
 * Writes the tagger's suggestions and scores of documents that still have no gold. A document
 * whose suggestions came from an import keeps them (only its score is written), unless the
 * import suggested no span at all.
 */
export async function writeShardResults(organizationId: string, corpusId: string, taggerId: string, results: ShardResult[], db: Db): Promise<number> {
  if (results.length === 0) return 0;
  const ids = results.map((r) => r.documentId);
  const open = new Set<string>(
    await db("documents").where({ organization_id: organizationId }).whereIn("id", ids).whereNot("annotation_status", "gold").pluck("id"),
  );
  const live = results.filter((r) => open.has(r.documentId));
  if (live.length === 0) return 0;
  await db("document_suggestions")
    .insert(live.map((r) => ({ document_id: r.documentId, organization_id: organizationId, spans: JSON.stringify(r.spans), source: "tagger", tagger_id: taggerId })))
    .onConflict("document_id")
    .merge(["spans", "source", "tagger_id", "created_at"])
    // An import that suggested nothing (an empty list) has nothing to keep: the tagger fills it.
    .where((w) => w.where("document_suggestions.source", "tagger").orWhereRaw("document_suggestions.spans = '[]'::jsonb"));
  await db("document_uncertainty")
    .insert(
      live.map((r) => ({
        document_id: r.documentId,
        organization_id: organizationId,
        corpus_id: corpusId,
        tagger_id: taggerId,
        mean_entropy: r.meanEntropy,
        least_confidence: r.leastConfidence,
        spans: r.spanConfidences.length,
        span_confidences: r.spanConfidences,
        scored_at: db.fn.now(),
      })),
    )
    .onConflict("document_id")
    .merge();
  return live.reduce((n, r) => n + r.spans.length, 0);
}

export async function addRunProgress(runId: string, documents: number, spans: number, db: Db): Promise<void> {
  await db("suggestion_runs")
    .where({ id: runId })
    .update({
      shards_done: db.raw("shards_done + 1"),
      documents_done: db.raw("documents_done + ?", [documents]),
      spans_suggested: db.raw("spans_suggested + ?", [spans]),
      finished_at: db.raw("CASE WHEN shards_done + 1 >= shards_total THEN now() ELSE finished_at END"),
    });
}

export type UncertaintyRow = {
  documentId: string;
  title: string;
  tokenCount: number;
  meanEntropy: number;
  leastConfidence: number;
  spanConfidences: number[];
};

/** Scored documents without gold, most uncertain first (ties by id, so the order is total). */
export async function listMostUncertain(organizationId: string, corpusId: string, taggerId: string, limit: number, db: Db = defaultDb): Promise<{ rows: UncertaintyRow[]; considered: number }> {
  const base = () =>
    db("document_uncertainty as u")
      .join("documents as d", "d.id", "u.document_id")
      .where({ "u.organization_id": organizationId, "u.corpus_id": corpusId, "u.tagger_id": taggerId })
      .whereNot("d.annotation_status", "gold");
  const [rows, count] = await Promise.all([
    base()
      .orderBy([{ column: "u.mean_entropy", order: "desc" }, { column: "u.document_id", order: "asc" }])
      .limit(limit)
      .select("u.document_id", "d.title", "d.token_count", "u.mean_entropy", "u.least_confidence", "u.span_confidences"),
    base().count({ n: "*" }).first(),
  ]);
  return {
    considered: Number(count?.n ?? 0),
    rows: rows.map((r) => ({
      documentId: r.document_id,
      title: r.title,
      tokenCount: r.token_count,
      meanEntropy: r.mean_entropy,
      leastConfidence: r.least_confidence,
      spanConfidences: r.span_confidences,
    })),
  };
}

/** The tagger suggestions of one document (none when they came from an import or are missing). */
export async function findTaggerSuggestions(organizationId: string, documentId: string, db: Db = defaultDb): Promise<{ taggerId: string; spans: StoredSuggestion[] } | null> {
  const r = await db("document_suggestions").where({ organization_id: organizationId, document_id: documentId, source: "tagger" }).first("tagger_id", "spans");
  return r && r.tagger_id ? { taggerId: r.tagger_id, spans: r.spans } : null;
}

export type Decision = { start: number; end: number; typeId: string; confidence: number; decision: "accepted" | "rejected" };

/** Records decisions (the latest decision on a suggestion in an assignment wins). */
export async function upsertDecisions(
  d: { organizationId: string; corpusId: string; documentId: string; assignmentId: string; taggerId: string; userId: string },
  decisions: Decision[],
  db: Db = defaultDb,
): Promise<void> {
  if (decisions.length === 0) return;
  await db("suggestion_decisions")
    .insert(
      decisions.map((x) => ({
        organization_id: d.organizationId,
        corpus_id: d.corpusId,
        document_id: d.documentId,
        assignment_id: d.assignmentId,
        tagger_id: d.taggerId,
        start: x.start,
        end: x.end,
        type_id: x.typeId,
        confidence: x.confidence,
        decision: x.decision,
        decided_by: d.userId,
      })),
    )
    .onConflict(["assignment_id", "start", "end", "type_id"])
    .merge(["decision", "decided_by", "decided_at", "tagger_id", "confidence"]);
}

export async function countDecisions(organizationId: string, corpusId: string, taggerId: string, db: Db = defaultDb): Promise<{ accepted: number; rejected: number }> {
  const rows: Array<{ decision: string; n: number }> = await db("suggestion_decisions")
    .where({ organization_id: organizationId, corpus_id: corpusId, tagger_id: taggerId })
    .groupBy("decision")
    .select("decision", db.raw("count(*)::int AS n"));
  const by = Object.fromEntries(rows.map((r) => [r.decision, r.n]));
  return { accepted: by.accepted ?? 0, rejected: by.rejected ?? 0 };
}
