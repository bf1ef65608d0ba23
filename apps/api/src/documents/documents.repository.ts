import type { AnnotationStatus, DocumentListItem, DocumentSplit, DocumentTokens } from "@tagloom/contracts";
import { db as defaultDb } from "@/db/knex";
import { type Db, iso } from "@/db/types";

/** A span as stored: character offsets and the entity type's id (names can change). */
export type StoredSpan = { start: number; end: number; typeId: string; confidence?: number };

/** A row of the Documents table, with the file it came from. */
export type DocumentRow = DocumentListItem & { uploadFileId: string | null };

type Raw = {
  id: string;
  corpus_id: string;
  upload_file_id: string | null;
  title: string;
  split: DocumentSplit | null;
  annotation_status: AnnotationStatus;
  char_count: number;
  token_count: number;
  sentence_count: number;
  filename?: string | null;
  created_at: Date;
};

export const toDocumentRow = (r: Raw): DocumentRow => ({
  id: r.id,
  corpusId: r.corpus_id,
  uploadFileId: r.upload_file_id,
  title: r.title,
  split: r.split,
  annotationStatus: r.annotation_status,
  charCount: r.char_count,
  tokenCount: r.token_count,
  sentenceCount: r.sentence_count,
  filename: r.filename ?? null,
  createdAt: iso(r.created_at)!,
});

export const documentColumns = [
  "d.id",
  "d.corpus_id",
  "d.upload_file_id",
  "d.title",
  "d.split",
  "d.annotation_status",
  "d.char_count",
  "d.token_count",
  "d.sentence_count",
  "d.created_at",
];

export async function findDocument(organizationId: string, documentId: string, db: Db = defaultDb): Promise<DocumentRow | null> {
  const r = await db("documents as d")
    .leftJoin("upload_files as f", "f.id", "d.upload_file_id")
    .where({ "d.organization_id": organizationId, "d.id": documentId })
    .first([...documentColumns, "f.filename"]);
  return r ? toDocumentRow(r) : null;
}

export async function findDocumentText(organizationId: string, documentId: string, db: Db = defaultDb): Promise<string | null> {
  const r = await db("documents").where({ organization_id: organizationId, id: documentId }).first("text");
  return r ? (r.text as string) : null;
}

export async function findDocumentTokens(organizationId: string, documentId: string, db: Db = defaultDb): Promise<DocumentTokens | null> {
  const r = await db("document_tokens").where({ organization_id: organizationId, document_id: documentId }).first("starts", "ends", "sentence_starts");
  return r ? { starts: r.starts, ends: r.ends, sentenceStarts: r.sentence_starts } : null;
}

export async function findDocumentsByIds(organizationId: string, documentIds: string[], db: Db = defaultDb): Promise<DocumentRow[]> {
  if (!documentIds.length) return [];
  const rows = await db("documents as d")
    .leftJoin("upload_files as f", "f.id", "d.upload_file_id")
    .where("d.organization_id", organizationId)
    .whereIn("d.id", documentIds)
    .select([...documentColumns, "f.filename"]);
  return rows.map(toDocumentRow);
}

export async function updateAnnotationStatus(organizationId: string, documentIds: string[], status: AnnotationStatus, db: Db = defaultDb): Promise<number> {
  if (!documentIds.length) return 0;
  return db("documents")
    .where("organization_id", organizationId)
    .whereIn("id", documentIds)
    .update({ annotation_status: status, updated_at: db.fn.now() });
}

export async function findGoldSpans(organizationId: string, documentId: string, db: Db = defaultDb): Promise<StoredSpan[] | null> {
  const r = await db("document_gold").where({ organization_id: organizationId, document_id: documentId }).first("spans");
  return r ? (r.spans as StoredSpan[]) : null;
}

export async function upsertGoldSpans(
  organizationId: string,
  documentId: string,
  spans: StoredSpan[],
  source: "import" | "review",
  userId: string | null,
  db: Db = defaultDb,
): Promise<void> {
  await db("document_gold")
    .insert({ document_id: documentId, organization_id: organizationId, spans: JSON.stringify(spans), source, updated_by: userId })
    .onConflict("document_id")
    // Every write of gold is a new version: a training run records the version it read.
    .merge({ spans: JSON.stringify(spans), source, updated_by: userId, updated_at: db.fn.now(), version: db.raw("document_gold.version + 1") });
}

export async function findSuggestedSpans(organizationId: string, documentId: string, db: Db = defaultDb): Promise<StoredSpan[] | null> {
  const r = await db("document_suggestions").where({ organization_id: organizationId, document_id: documentId }).first("spans");
  return r ? (r.spans as StoredSpan[]) : null;
}

type SpanTable = "document_gold" | "document_suggestions";

/** How many spans of the type a span table holds, and in how many documents. */
export async function summarizeSpansOfType(
  table: SpanTable,
  organizationId: string,
  typeId: string,
  db: Db = defaultDb,
): Promise<{ spans: number; documents: number }> {
  const r = await db.raw(
    `SELECT count(*)::int AS documents,
            coalesce(sum((SELECT count(*) FROM jsonb_array_elements(t.spans) s WHERE s->>'typeId' = ?)), 0)::int AS spans
     FROM ?? t WHERE t.organization_id = ? AND t.spans @> ?::jsonb`,
    [typeId, table, organizationId, JSON.stringify([{ typeId }])],
  );
  return { spans: r.rows[0].spans, documents: r.rows[0].documents };
}

/** Drops the type's spans from every row of a span table (order of the rest kept); returns the count removed. */
export async function removeSpansOfType(table: SpanTable, organizationId: string, typeId: string, db: Db): Promise<number> {
  const { spans } = await summarizeSpansOfType(table, organizationId, typeId, db);
  if (spans === 0) return 0;
  await db.raw(
    `UPDATE ?? t SET spans = coalesce(
       (SELECT jsonb_agg(e.s ORDER BY e.ord) FROM jsonb_array_elements(t.spans) WITH ORDINALITY AS e(s, ord) WHERE e.s->>'typeId' <> ?),
       '[]'::jsonb)${table === "document_gold" ? ", version = t.version + 1" : ""}
     WHERE t.organization_id = ? AND t.spans @> ?::jsonb`,
    [table, typeId, organizationId, JSON.stringify([{ typeId }])],
  );
  return spans;
}

export type NewDocument = {
  organizationId: string;
  corpusId: string;
  uploadFileId: string | null;
  sourceIndex: number;
  title: string;
  text: string;
  contentHash: string;
  split: DocumentSplit | null;
  annotationStatus: AnnotationStatus;
  tokens: DocumentTokens;
  gold?: { spans: StoredSpan[]; userId: string | null } | undefined;
  suggestions?: StoredSpan[] | undefined;
};

const INSERT_CHUNK = 250;

/**
 * Inserts documents with their tokens and spans. A document whose (upload file, index) already
 * exists is skipped with its tokens and spans, so a retried import never adds one twice.
 * Returns the ids of the documents inserted now.
 */
export async function insertDocuments(docs: NewDocument[], db: Db): Promise<string[]> {
  const inserted: string[] = [];
  for (let i = 0; i < docs.length; i += INSERT_CHUNK) {
    const chunk = docs.slice(i, i + INSERT_CHUNK);
    const rows: Array<{ id: string; upload_file_id: string | null; source_index: number }> = await db("documents")
      .insert(
        chunk.map((d) => ({
          organization_id: d.organizationId,
          corpus_id: d.corpusId,
          upload_file_id: d.uploadFileId,
          source_index: d.sourceIndex,
          title: d.title,
          text: d.text,
          content_hash: d.contentHash,
          split: d.split,
          annotation_status: d.annotationStatus,
          char_count: d.text.length,
          token_count: d.tokens.starts.length,
          sentence_count: d.tokens.sentenceStarts.length,
        })),
      )
      .onConflict(db.raw("(upload_file_id, source_index)"))
      .ignore()
      .returning(["id", "upload_file_id", "source_index"]);
    const key = (fileId: string | null, index: number) => `${fileId ?? ""}:${index}`;
    const byKey = new Map(chunk.map((d) => [key(d.uploadFileId, d.sourceIndex), d]));
    const tokenRows: object[] = [];
    const goldRows: object[] = [];
    const suggestionRows: object[] = [];
    for (const r of rows) {
      const d = byKey.get(key(r.upload_file_id, r.source_index));
      if (!d) continue;
      inserted.push(r.id);
      tokenRows.push({
        document_id: r.id,
        organization_id: d.organizationId,
        starts: d.tokens.starts,
        ends: d.tokens.ends,
        sentence_starts: d.tokens.sentenceStarts,
      });
      if (d.gold) {
        goldRows.push({ document_id: r.id, organization_id: d.organizationId, spans: JSON.stringify(d.gold.spans), source: "import", updated_by: d.gold.userId });
      }
      if (d.suggestions) {
        suggestionRows.push({ document_id: r.id, organization_id: d.organizationId, spans: JSON.stringify(d.suggestions), source: "import" });
      }
    }
    if (tokenRows.length) await db("document_tokens").insert(tokenRows);
    if (goldRows.length) await db("document_gold").insert(goldRows);
    if (suggestionRows.length) await db("document_suggestions").insert(suggestionRows);
  }
  return inserted;
}

export type DocumentListFilter = {
  sort: "created" | "title" | "tokens";
  dir: "asc" | "desc";
  split?: "train" | "test" | "none" | undefined;
  status?: AnnotationStatus | undefined;
  q?: string | undefined;
};

const SORT_COLUMNS = { created: "d.created_at", title: "d.title", tokens: "d.token_count" } as const;

/**
 * One page of a corpus's documents by keyset: rows after (sort value, id) in the chosen order.
 * `cursorValue` of each row is its sort value exactly as the next page must compare it (created_at
 * as PostgreSQL text, to the microsecond).
 */
export async function listDocuments(
  organizationId: string,
  corpusId: string,
  filter: DocumentListFilter,
  page: { limit: number; after?: { value: string | number; id: string } | undefined },
  db: Db = defaultDb,
): Promise<Array<DocumentRow & { cursorValue: string | number }>> {
  const column = SORT_COLUMNS[filter.sort];
  const q = db("documents as d")
    .leftJoin("upload_files as f", "f.id", "d.upload_file_id")
    .where({ "d.organization_id": organizationId, "d.corpus_id": corpusId })
    .select([...documentColumns, "f.filename", db.raw(`${filter.sort === "created" ? "d.created_at::text" : column} AS cursor_value`)]);
  if (filter.split === "none") q.whereNull("d.split");
  else if (filter.split) q.where("d.split", filter.split);
  if (filter.status) q.where("d.annotation_status", filter.status);
  if (filter.q) q.whereRaw("d.search @@ websearch_to_tsquery('simple', ?)", [filter.q]);
  if (page.after) {
    const op = filter.dir === "asc" ? ">" : "<";
    const cast = filter.sort === "created" ? "::timestamptz" : filter.sort === "tokens" ? "::int" : "::text";
    q.whereRaw(`(${column}, d.id) ${op} (?${cast}, ?::uuid)`, [page.after.value, page.after.id]);
  }
  const rows = await q.orderBy([{ column, order: filter.dir }, { column: "d.id", order: filter.dir }]).limit(page.limit);
  return rows.map((r: Raw & { cursor_value: string | number }) => ({ ...toDocumentRow(r), cursorValue: r.cursor_value }));
}

export async function deleteDocumentRow(organizationId: string, documentId: string, db: Db = defaultDb): Promise<boolean> {
  return (await db("documents").where({ organization_id: organizationId, id: documentId }).delete()) > 0;
}

/** Ids of a corpus's documents in id order (all of them, or only those in neither split). */
export async function listDocumentIds(organizationId: string, corpusId: string, onlyUnassigned: boolean, db: Db = defaultDb): Promise<string[]> {
  const q = db("documents").where({ organization_id: organizationId, corpus_id: corpusId });
  if (onlyUnassigned) q.whereNull("split");
  const rows: Array<{ id: string }> = await q.orderBy("id").select("id");
  return rows.map((r) => r.id);
}

/** Sets the split of the corpus's documents among the ids; returns how many changed rows matched. */
export async function updateSplit(
  organizationId: string,
  corpusId: string,
  documentIds: string[],
  split: DocumentSplit | null,
  db: Db = defaultDb,
): Promise<number> {
  let count = 0;
  for (let i = 0; i < documentIds.length; i += 5000) {
    count += await db("documents")
      .where({ organization_id: organizationId, corpus_id: corpusId })
      .whereRaw("id = ANY(?::uuid[])", [documentIds.slice(i, i + 5000)])
      .update({ split, updated_at: db.fn.now() });
  }
  return count;
}

/**
 * Puts the given documents in test and the others given in train with one statement, so that the
 * rows are locked in one pass (two statements could lock them in two orders and deadlock against
 * another writer). Returns how many rows changed.
 */
export async function assignSplits(organizationId: string, corpusId: string, testIds: string[], trainIds: string[], db: Db = defaultDb): Promise<number> {
  if (!testIds.length && !trainIds.length) return 0;
  return db("documents")
    .where({ organization_id: organizationId, corpus_id: corpusId })
    .whereRaw("id = ANY(?::uuid[])", [[...testIds, ...trainIds]])
    .update({ split: db.raw("CASE WHEN id = ANY(?::uuid[]) THEN 'test' ELSE 'train' END", [testIds]), updated_at: db.fn.now() });
}

/** A gold document as the export reads it, one at a time from a database cursor. */
export type GoldDocumentRow = {
  id: string;
  title: string;
  text: string;
  split: DocumentSplit | null;
  starts: number[];
  ends: number[];
  sentenceStarts: number[];
  spans: StoredSpan[];
};

/**
 * The corpus's gold documents (with tokens and spans) in upload order, as a stream of rows from
 * a server-side cursor, so that an export of any size holds only a few rows in memory.
 */
export function streamGoldDocumentRows(
  organizationId: string,
  corpusId: string,
  split: DocumentSplit | "all",
  db: Db = defaultDb,
): NodeJS.ReadableStream & AsyncIterable<Record<string, unknown>> {
  const q = db("documents as d")
    .join("document_gold as g", "g.document_id", "d.id")
    .join("document_tokens as t", "t.document_id", "d.id")
    .leftJoin("upload_files as f", "f.id", "d.upload_file_id")
    .where({ "d.organization_id": organizationId, "d.corpus_id": corpusId, "d.annotation_status": "gold" })
    .select("d.id", "d.title", "d.text", "d.split", "t.starts", "t.ends", "t.sentence_starts", "g.spans")
    // Upload order: documents stored in one transaction share created_at, so the file's place in
    // its upload and the document's place in its file come next.
    .orderBy([{ column: "d.created_at" }, { column: "f.file_index" }, { column: "d.source_index" }, { column: "d.id" }]);
  if (split !== "all") q.where("d.split", split);
  return q.stream({ highWaterMark: 50 }) as unknown as NodeJS.ReadableStream & AsyncIterable<Record<string, unknown>>;
}

export const toGoldDocumentRow = (r: Record<string, unknown>): GoldDocumentRow => ({
  id: r.id as string,
  title: r.title as string,
  text: r.text as string,
  split: r.split as DocumentSplit | null,
  starts: r.starts as number[],
  ends: r.ends as number[],
  sentenceStarts: r.sentence_starts as number[],
  spans: r.spans as StoredSpan[],
});
