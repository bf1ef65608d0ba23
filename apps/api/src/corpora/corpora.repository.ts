import type { Corpus } from "@tagloom/contracts";
import { db as defaultDb } from "@/db/knex";
import { type Db, iso } from "@/db/types";

type Raw = {
  id: string;
  name: string;
  description: string;
  archived_at: Date | null;
  created_at: Date;
  updated_at: Date;
};

const toCorpus = (r: Raw): Corpus => ({
  id: r.id,
  name: r.name,
  description: r.description,
  archivedAt: iso(r.archived_at),
  createdAt: iso(r.created_at)!,
  updatedAt: iso(r.updated_at)!,
});

const columns = ["id", "name", "description", "archived_at", "created_at", "updated_at"];

export async function findCorpus(organizationId: string, corpusId: string, db: Db = defaultDb): Promise<Corpus | null> {
  const r = await db("corpora").where({ organization_id: organizationId, id: corpusId }).first(columns);
  return r ? toCorpus(r) : null;
}

/** Locks the corpus row for the rest of the transaction (schema edits, deletes). */
export async function lockCorpus(organizationId: string, corpusId: string, db: Db): Promise<Corpus | null> {
  const r = await db("corpora").where({ organization_id: organizationId, id: corpusId }).forUpdate().first(columns);
  return r ? toCorpus(r) : null;
}

export async function findCorpusByName(organizationId: string, name: string, db: Db = defaultDb): Promise<Corpus | null> {
  const r = await db("corpora")
    .where({ organization_id: organizationId })
    .andWhereRaw("lower(name) = lower(?)", [name])
    .first(columns);
  return r ? toCorpus(r) : null;
}

/** `cursorAt` is created_at as PostgreSQL text: exact to the microsecond, unlike a JS Date. */
export type CorpusRowWithCounts = Corpus & { documentCount: number; entityTypeCount: number; cursorAt: string };

/** Newest first; `after` is the last row of the previous page. */
export async function listCorpora(
  organizationId: string,
  options: { archived: "true" | "false" | "all"; limit: number; after?: { createdAt: string; id: string } | undefined },
  db: Db = defaultDb,
): Promise<CorpusRowWithCounts[]> {
  const q = db("corpora as c")
    .where("c.organization_id", organizationId)
    .select(
      ...columns.map((c) => `c.${c}`),
      db.raw("c.created_at::text AS cursor_at"),
      db.raw("(SELECT count(*) FROM documents d WHERE d.corpus_id = c.id) AS document_count"),
      db.raw("(SELECT count(*) FROM entity_types t WHERE t.corpus_id = c.id) AS entity_type_count"),
    );
  if (options.archived === "true") q.whereNotNull("c.archived_at");
  if (options.archived === "false") q.whereNull("c.archived_at");
  if (options.after) q.andWhereRaw("(c.created_at, c.id) < (?::timestamptz, ?::uuid)", [options.after.createdAt, options.after.id]);
  const rows = await q.orderBy([{ column: "c.created_at", order: "desc" }, { column: "c.id", order: "desc" }]).limit(options.limit);
  return rows.map((r: Raw & { document_count: number; entity_type_count: number; cursor_at: string }) => ({
    ...toCorpus(r),
    cursorAt: r.cursor_at,
    documentCount: Number(r.document_count),
    entityTypeCount: Number(r.entity_type_count),
  }));
}

export async function insertCorpus(
  row: { organizationId: string; name: string; description: string; createdBy: string | null },
  db: Db = defaultDb,
): Promise<Corpus> {
  const [r] = await db("corpora")
    .insert({ organization_id: row.organizationId, name: row.name, description: row.description, created_by: row.createdBy })
    .returning(columns);
  return toCorpus(r);
}

export async function updateCorpus(
  organizationId: string,
  corpusId: string,
  patch: { name?: string | undefined; description?: string | undefined; archived?: boolean | undefined },
  db: Db = defaultDb,
): Promise<Corpus | null> {
  const changes: Record<string, unknown> = { updated_at: db.fn.now() };
  if (patch.name !== undefined) changes.name = patch.name;
  if (patch.description !== undefined) changes.description = patch.description;
  if (patch.archived !== undefined) changes.archived_at = patch.archived ? db.raw("coalesce(archived_at, now())") : null;
  const [r] = await db("corpora").where({ organization_id: organizationId, id: corpusId }).update(changes).returning(columns);
  return r ? toCorpus(r) : null;
}

/** Deletes the corpus; its documents, files, spans and taggers go with it (ON DELETE CASCADE). */
export async function deleteCorpus(organizationId: string, corpusId: string, db: Db = defaultDb): Promise<boolean> {
  return (await db("corpora").where({ organization_id: organizationId, id: corpusId }).delete()) > 0;
}

/** Documents per split and per annotation status, and files not yet processed. */
export async function countCorpusContents(
  organizationId: string,
  corpusId: string,
  db: Db = defaultDb,
): Promise<{ splits: Record<"train" | "test" | "none", number>; statuses: Record<"none" | "in_progress" | "submitted" | "gold", number>; pendingFiles: number; entityTypeCount: number }> {
  const rows: Array<{ split: string | null; annotation_status: string; n: number }> = await db("documents")
    .where({ organization_id: organizationId, corpus_id: corpusId })
    .groupBy("split", "annotation_status")
    .select("split", "annotation_status", db.raw("count(*)::int AS n"));
  const splits = { train: 0, test: 0, none: 0 };
  const statuses = { none: 0, in_progress: 0, submitted: 0, gold: 0 };
  for (const r of rows) {
    splits[(r.split ?? "none") as keyof typeof splits] += r.n;
    statuses[r.annotation_status as keyof typeof statuses] += r.n;
  }
  const [pending] = await db("upload_files")
    .where({ organization_id: organizationId, corpus_id: corpusId })
    .whereIn("state", ["queued", "processing"])
    .count<{ n: number }[]>({ n: "*" });
  const [types] = await db("entity_types").where({ organization_id: organizationId, corpus_id: corpusId }).count<{ n: number }[]>({ n: "*" });
  return { splits, statuses, pendingFiles: Number(pending?.n ?? 0), entityTypeCount: Number(types?.n ?? 0) };
}
