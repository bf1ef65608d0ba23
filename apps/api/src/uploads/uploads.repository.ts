import type { DocumentSplit, FileProblem, FileState, SpanMode, Upload, UploadFile, UploadFormat } from "@tagloom/contracts";
import { db as defaultDb } from "@/db/knex";
import { type Db, iso } from "@/db/types";

type UploadRaw = { id: string; corpus_id: string; span_mode: SpanMode; default_split: DocumentSplit | null; created_by: string | null; created_at: Date };
const uploadColumns = ["u.id", "u.corpus_id", "u.span_mode", "u.default_split", "u.created_by", "u.created_at"];

const emptyCounts = (): Record<FileState, number> => ({ queued: 0, processing: 0, ready: 0, failed: 0 });

type FileRaw = {
  id: string;
  upload_id: string;
  file_index: number;
  filename: string;
  format: UploadFormat | null;
  size_bytes: number;
  state: FileState;
  error: string | null;
  problems: FileProblem[];
  documents_created: number;
  created_at: Date;
  finished_at: Date | null;
};
const fileColumns = ["id", "upload_id", "file_index", "filename", "format", "size_bytes", "state", "error", "problems", "documents_created", "created_at", "finished_at"];
const toFile = (r: FileRaw): UploadFile => ({
  id: r.id,
  uploadId: r.upload_id,
  fileIndex: r.file_index,
  filename: r.filename,
  format: r.format,
  sizeBytes: r.size_bytes,
  state: r.state,
  error: r.error,
  problems: r.problems ?? [],
  documentsCreated: r.documents_created,
  createdAt: iso(r.created_at)!,
  finishedAt: iso(r.finished_at),
});

export type UploadRow = Omit<Upload, "counts">;
const toUpload = (r: UploadRaw): UploadRow => ({
  id: r.id,
  corpusId: r.corpus_id,
  spanMode: r.span_mode,
  defaultSplit: r.default_split,
  createdBy: r.created_by,
  createdAt: iso(r.created_at)!,
});

export async function insertUpload(
  row: { organizationId: string; corpusId: string; createdBy: string | null; spanMode: SpanMode; defaultSplit: DocumentSplit | null },
  db: Db,
): Promise<UploadRow> {
  const [r] = await db("uploads as u")
    .insert({ organization_id: row.organizationId, corpus_id: row.corpusId, created_by: row.createdBy, span_mode: row.spanMode, default_split: row.defaultSplit })
    .returning(["id", "corpus_id", "span_mode", "default_split", "created_by", "created_at"]);
  return toUpload(r);
}

export type NewUploadFile = {
  fileIndex: number;
  filename: string;
  format: UploadFormat | null;
  sizeBytes: number;
  contentHash: string;
  content: Buffer | null;
  /** Refused before processing: stored as `failed` with this reason. */
  refusal: string | null;
};

/** Inserts the files of an upload (in chunks, bytes included) and returns them without their bytes. */
export async function insertUploadFiles(organizationId: string, corpusId: string, uploadId: string, files: NewUploadFile[], db: Db): Promise<UploadFile[]> {
  const out: UploadFile[] = [];
  // Small chunks keep each statement's parameters (and bytes) modest.
  for (let i = 0; i < files.length; i += 200) {
    const rows = await db("upload_files")
      .insert(
        files.slice(i, i + 200).map((f) => ({
          organization_id: organizationId,
          upload_id: uploadId,
          corpus_id: corpusId,
          file_index: f.fileIndex,
          filename: f.filename,
          format: f.format,
          size_bytes: f.sizeBytes,
          content_hash: f.contentHash,
          content: f.refusal ? null : f.content,
          state: f.refusal ? "failed" : "queued",
          error: f.refusal,
          finished_at: f.refusal ? db.fn.now() : null,
        })),
      )
      .returning(fileColumns);
    out.push(...rows.map(toFile));
  }
  return out;
}

export async function findUpload(organizationId: string, corpusId: string, uploadId: string, db: Db = defaultDb): Promise<UploadRow | null> {
  const r = await db("uploads as u").where({ "u.organization_id": organizationId, "u.corpus_id": corpusId, "u.id": uploadId }).first(uploadColumns);
  return r ? toUpload(r) : null;
}

/** Files of the corpus per state, for one upload or all of them. */
export async function countFilesByState(organizationId: string, corpusId: string, uploadIds: string[] | null, db: Db = defaultDb): Promise<Map<string, Record<FileState, number>>> {
  const q = db("upload_files").where({ organization_id: organizationId, corpus_id: corpusId });
  if (uploadIds) q.whereIn("upload_id", uploadIds);
  const rows: Array<{ upload_id: string; state: FileState; n: number }> = await q.groupBy("upload_id", "state").select("upload_id", "state", db.raw("count(*)::int AS n"));
  const out = new Map<string, Record<FileState, number>>();
  for (const r of rows) {
    const c = out.get(r.upload_id) ?? emptyCounts();
    c[r.state] += r.n;
    out.set(r.upload_id, c);
  }
  return out;
}

/** Newest uploads of the corpus first. */
export async function listUploads(
  organizationId: string,
  corpusId: string,
  page: { limit: number; after?: { value: string | number; id: string } | undefined },
  db: Db = defaultDb,
): Promise<Array<UploadRow & { cursorValue: string }>> {
  const q = db("uploads as u")
    .where({ "u.organization_id": organizationId, "u.corpus_id": corpusId })
    .select([...uploadColumns, db.raw("u.created_at::text AS cursor_value")]);
  if (page.after) q.whereRaw("(u.created_at, u.id) < (?::timestamptz, ?::uuid)", [page.after.value, page.after.id]);
  const rows = await q.orderBy([{ column: "u.created_at", order: "desc" }, { column: "u.id", order: "desc" }]).limit(page.limit);
  return rows.map((r: UploadRaw & { cursor_value: string }) => ({ ...toUpload(r), cursorValue: r.cursor_value }));
}

/** Files of the corpus, newest first (then by their place in the upload). */
export async function listFiles(
  organizationId: string,
  corpusId: string,
  filter: { state?: FileState | undefined; uploadId?: string | undefined },
  page: { limit: number; after?: { value: string | number; id: string } | undefined },
  db: Db = defaultDb,
): Promise<Array<UploadFile & { cursorValue: string }>> {
  const q = db("upload_files")
    .where({ organization_id: organizationId, corpus_id: corpusId })
    .select([...fileColumns, db.raw("created_at::text AS cursor_value")]);
  if (filter.state) q.where("state", filter.state);
  if (filter.uploadId) q.where("upload_id", filter.uploadId);
  if (page.after) q.whereRaw("(created_at, id) < (?::timestamptz, ?::uuid)", [page.after.value, page.after.id]);
  const rows = await q.orderBy([{ column: "created_at", order: "desc" }, { column: "id", order: "desc" }]).limit(page.limit);
  return rows.map((r: FileRaw & { cursor_value: string }) => ({ ...toFile(r), cursorValue: r.cursor_value }));
}

export async function listUploadFiles(organizationId: string, uploadId: string, db: Db = defaultDb): Promise<UploadFile[]> {
  const rows = await db("upload_files").where({ organization_id: organizationId, upload_id: uploadId }).orderBy("file_index").select(fileColumns);
  return rows.map(toFile);
}

export type ClaimedFile = { id: string; filename: string; format: UploadFormat; sizeBytes: number };

/**
 * Marks the files `processing` and returns those still to do: files already ready or failed (a
 * retried job after its work was committed) are left alone and not returned.
 */
export async function claimFiles(organizationId: string, fileIds: string[], db: Db = defaultDb): Promise<ClaimedFile[]> {
  if (!fileIds.length) return [];
  // The rows are locked in id order, as lockUnfinishedFiles locks them: a plain UPDATE locks them
  // in scan order and deadlocks with a duplicate run of the job that is storing the same files.
  const { rows } = await db.raw(
    `WITH mine AS (
       SELECT id FROM upload_files
       WHERE organization_id = ? AND id = ANY(?::uuid[]) AND state IN ('queued', 'processing')
       ORDER BY id FOR UPDATE
     )
     , claimed AS (
       UPDATE upload_files f SET state = 'processing', started_at = now()
       FROM mine WHERE f.id = mine.id
       RETURNING f.id, f.filename, f.format, f.size_bytes, f.file_index
     )
     SELECT id, filename, format, size_bytes FROM claimed ORDER BY file_index`,
    [organizationId, fileIds],
  );
  return rows.map((r: { id: string; filename: string; format: UploadFormat; size_bytes: number }) => ({ id: r.id, filename: r.filename, format: r.format, sizeBytes: r.size_bytes }));
}

export async function findFileContent(organizationId: string, fileId: string, db: Db = defaultDb): Promise<Buffer | null> {
  const r = await db("upload_files").where({ organization_id: organizationId, id: fileId }).first("content");
  return r?.content ?? null;
}

/**
 * Locks the files (in id order, so two jobs never deadlock) and returns those still unfinished.
 * A job that claimed a file which another job finished meanwhile gets it back here no longer: it
 * must write neither documents nor an outcome for it.
 */
export async function lockUnfinishedFiles(organizationId: string, fileIds: string[], db: Db): Promise<Set<string>> {
  if (!fileIds.length) return new Set();
  const rows: Array<{ id: string; state: FileState }> = await db("upload_files")
    .where("organization_id", organizationId)
    .whereRaw("id = ANY(?::uuid[])", [fileIds])
    .orderBy("id")
    .forUpdate()
    .select("id", "state");
  return new Set(rows.filter((r) => r.state === "queued" || r.state === "processing").map((r) => r.id));
}

export type FileOutcome = { id: string; state: "ready" | "failed"; error: string | null; problems: FileProblem[]; documentsCreated: number };

/** Records how each file ended, and drops its bytes (the documents now hold the text). */
export async function finishFiles(organizationId: string, outcomes: FileOutcome[], db: Db): Promise<void> {
  if (!outcomes.length) return;
  await db.raw(
    `UPDATE upload_files f
     SET state = v.state, error = v.error, problems = v.problems::jsonb, documents_created = v.n, finished_at = now(), content = NULL
     FROM unnest(?::uuid[], ?::text[], ?::text[], ?::text[], ?::int[]) AS v(id, state, error, problems, n)
     WHERE f.id = v.id AND f.organization_id = ?`,
    [
      outcomes.map((o) => o.id),
      outcomes.map((o) => o.state),
      outcomes.map((o) => o.error) as unknown as string[],
      outcomes.map((o) => JSON.stringify(o.problems)),
      outcomes.map((o) => o.documentsCreated),
      organizationId,
    ],
  );
}

/** Fails files that could not be handed to a worker (their bytes are dropped). */
export async function failFiles(organizationId: string, fileIds: string[], reason: string, db: Db = defaultDb): Promise<void> {
  await db("upload_files")
    .where("organization_id", organizationId)
    .whereRaw("id = ANY(?::uuid[])", [fileIds])
    .whereIn("state", ["queued", "processing"])
    .update({ state: "failed", error: reason, finished_at: db.fn.now(), content: null });
}
