import type { Knex } from "knex";

// Batches of documents handed to annotators, and assignments: one annotator on one document of a
// batch, with that annotator's spans ([{ start, end, typeId, origin }], character offsets, end
// exclusive) and the suggestions they dismissed. `version` grows by one with every save; a save
// names the version it started from and only that version may be replaced (no lost updates).
export async function up(knex: Knex): Promise<void> {
  const tenant = (t: Knex.CreateTableBuilder) =>
    t.uuid("organization_id").notNullable().references("id").inTable("organizations").onDelete("CASCADE");

  await knex.schema.createTable("batches", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    tenant(t);
    t.uuid("corpus_id").notNullable().references("id").inTable("corpora").onDelete("CASCADE");
    t.text("name").notNullable();
    t.date("due_date");
    t.integer("annotators_per_document").notNullable();
    t.text("created_by").references("id").inTable("auth_user").onDelete("SET NULL");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(["organization_id", "corpus_id", "created_at"]);
  });

  await knex.schema.createTable("assignments", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    tenant(t);
    t.uuid("corpus_id").notNullable().references("id").inTable("corpora").onDelete("CASCADE");
    t.uuid("batch_id").notNullable().references("id").inTable("batches").onDelete("CASCADE");
    t.uuid("document_id").notNullable().references("id").inTable("documents").onDelete("CASCADE");
    t.text("annotator_id").notNullable().references("id").inTable("auth_user").onDelete("CASCADE");
    t.text("state").notNullable().defaultTo("open"); // open | in_progress | submitted | accepted | returned
    t.jsonb("spans").notNullable().defaultTo("[]");
    t.jsonb("dismissed_suggestions").notNullable().defaultTo("[]");
    t.integer("version").notNullable().defaultTo(0);
    t.text("review_comment");
    t.text("reviewed_by").references("id").inTable("auth_user").onDelete("SET NULL");
    t.timestamp("reviewed_at", { useTz: true });
    t.timestamp("started_at", { useTz: true });
    t.timestamp("submitted_at", { useTz: true });
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("updated_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(["batch_id", "document_id", "annotator_id"]);
    // Batch page: progress per annotator; review: the assignments of one document of a batch.
    t.index(["batch_id", "annotator_id", "state"]);
    t.index(["batch_id", "document_id"]);
    // Review list of a corpus.
    t.index(["organization_id", "corpus_id", "state"]);
    t.index(["document_id"]);
  });
  await knex.raw(
    "ALTER TABLE assignments ADD CONSTRAINT assignments_state_check CHECK (state IN ('open','in_progress','submitted','accepted','returned'))",
  );
  // An annotator's queue: their unfinished assignments in one organization.
  await knex.raw(
    "CREATE INDEX assignments_queue ON assignments (organization_id, annotator_id, created_at) WHERE state IN ('open','in_progress','returned')",
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists("assignments");
  await knex.schema.dropTableIfExists("batches");
}
