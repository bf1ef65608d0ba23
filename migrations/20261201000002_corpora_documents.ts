import type { Knex } from "knex";

// Corpora with their entity schemas, uploads (files are kept in the database until a worker has
// processed them, so workers on any machine can read them), documents with their tokens, and a
// document's gold spans and imported or tagger suggestions. Spans refer to entity types by id so
// that renaming a type keeps its spans.
export async function up(knex: Knex): Promise<void> {
  const tenant = (t: Knex.CreateTableBuilder) =>
    t.uuid("organization_id").notNullable().references("id").inTable("organizations").onDelete("CASCADE");

  await knex.schema.createTable("corpora", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    tenant(t);
    t.text("name").notNullable();
    t.text("description").notNullable().defaultTo("");
    t.timestamp("archived_at", { useTz: true });
    t.text("created_by").references("id").inTable("auth_user").onDelete("SET NULL");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("updated_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(["organization_id", "created_at"]);
  });
  await knex.raw("CREATE UNIQUE INDEX corpora_org_name_unique ON corpora (organization_id, lower(name))");

  await knex.schema.createTable("entity_types", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    tenant(t);
    t.uuid("corpus_id").notNullable().references("id").inTable("corpora").onDelete("CASCADE");
    t.text("name").notNullable();
    t.text("color").notNullable();
    t.text("hotkey");
    t.text("guideline").notNullable().defaultTo("");
    t.integer("position").notNullable().defaultTo(0);
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(["corpus_id", "name"]);
  });
  await knex.raw("CREATE UNIQUE INDEX entity_types_hotkey_unique ON entity_types (corpus_id, hotkey) WHERE hotkey IS NOT NULL");

  await knex.schema.createTable("uploads", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    tenant(t);
    t.uuid("corpus_id").notNullable().references("id").inTable("corpora").onDelete("CASCADE");
    t.text("created_by").references("id").inTable("auth_user").onDelete("SET NULL");
    t.text("span_mode").notNullable().defaultTo("gold"); // gold | suggested
    t.text("default_split"); // train | test | null
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(["corpus_id", "created_at"]);
  });

  await knex.schema.createTable("upload_files", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    tenant(t);
    t.uuid("upload_id").notNullable().references("id").inTable("uploads").onDelete("CASCADE");
    t.uuid("corpus_id").notNullable().references("id").inTable("corpora").onDelete("CASCADE");
    t.integer("file_index").notNullable();
    t.text("filename").notNullable();
    t.text("format").notNullable(); // txt | pdf | docx | jsonl | conll
    t.integer("size_bytes").notNullable();
    t.text("content_hash").notNullable();
    t.binary("content"); // cleared once processed
    t.text("state").notNullable().defaultTo("queued"); // queued | processing | ready | failed
    t.text("error");
    t.jsonb("problems").notNullable().defaultTo("[]"); // per-line problems of JSONL/CoNLL files
    t.integer("documents_created").notNullable().defaultTo(0);
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("started_at", { useTz: true });
    t.timestamp("finished_at", { useTz: true });
    t.unique(["upload_id", "file_index"]);
    t.index(["corpus_id", "created_at"]);
    t.index(["corpus_id", "state"]);
  });

  await knex.schema.createTable("documents", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    tenant(t);
    t.uuid("corpus_id").notNullable().references("id").inTable("corpora").onDelete("CASCADE");
    t.uuid("upload_file_id").references("id").inTable("upload_files").onDelete("SET NULL");
    t.integer("source_index").notNullable().defaultTo(0); // line or document number inside the file
    t.text("title").notNullable();
    t.text("text").notNullable();
    t.text("content_hash").notNullable();
    t.text("split"); // train | test | null
    // none | in_progress | submitted | gold (kept up to date by the annotation services)
    t.text("annotation_status").notNullable().defaultTo("none");
    t.integer("char_count").notNullable();
    t.integer("token_count").notNullable();
    t.integer("sentence_count").notNullable();
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("updated_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    // A retried extraction job finds its own documents instead of adding them twice.
    t.unique(["upload_file_id", "source_index"]);
    t.index(["corpus_id", "created_at", "id"]);
    t.index(["corpus_id", "title", "id"]);
    t.index(["corpus_id", "split"]);
    t.index(["corpus_id", "annotation_status"]);
  });
  await knex.raw("ALTER TABLE documents ADD CONSTRAINT documents_split_check CHECK (split IS NULL OR split IN ('train','test'))");
  await knex.raw(
    "ALTER TABLE documents ADD CONSTRAINT documents_status_check CHECK (annotation_status IN ('none','in_progress','submitted','gold'))",
  );
  await knex.raw(
    "ALTER TABLE documents ADD COLUMN search tsvector GENERATED ALWAYS AS (to_tsvector('simple', title || ' ' || text)) STORED",
  );
  await knex.raw("CREATE INDEX documents_search_gin ON documents USING GIN (search)");

  // Tokens as parallel arrays of UTF-16 offsets (end exclusive); sentences as the index of their
  // first token. Kept apart from documents so that listing documents never reads them.
  await knex.schema.createTable("document_tokens", (t) => {
    t.uuid("document_id").primary().references("id").inTable("documents").onDelete("CASCADE");
    tenant(t);
    t.specificType("starts", "integer[]").notNullable();
    t.specificType("ends", "integer[]").notNullable();
    t.specificType("sentence_starts", "integer[]").notNullable();
  });

  // Gold spans of a document: [{ start, end, typeId }], character offsets, end exclusive.
  await knex.schema.createTable("document_gold", (t) => {
    t.uuid("document_id").primary().references("id").inTable("documents").onDelete("CASCADE");
    tenant(t);
    t.jsonb("spans").notNullable().defaultTo("[]");
    t.text("source").notNullable(); // import | review
    t.text("updated_by").references("id").inTable("auth_user").onDelete("SET NULL");
    t.timestamp("updated_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });

  // Suggested spans: [{ start, end, typeId, confidence }] from an import or from a tagger.
  await knex.schema.createTable("document_suggestions", (t) => {
    t.uuid("document_id").primary().references("id").inTable("documents").onDelete("CASCADE");
    tenant(t);
    t.jsonb("spans").notNullable().defaultTo("[]");
    t.text("source").notNullable(); // import | tagger
    t.uuid("tagger_id");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const table of ["document_suggestions", "document_gold", "document_tokens", "documents", "upload_files", "uploads", "entity_types", "corpora"]) {
    await knex.schema.dropTableIfExists(table);
  }
}
