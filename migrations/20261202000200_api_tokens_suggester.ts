import type { Knex } from "knex";

// Organization API tokens for /api/v1 (only a SHA-256 hash of the secret is kept, with a short
// visible prefix so that people can recognise a token in the list), the corpus's suggester (the
// tagger that pre-annotates its documents), suggestion runs (one per suggester change or batch of
// new documents, counted in shards like training) and the record of what annotators did with
// tagger suggestions (accepted or rejected), from which the suggester's precision is computed,
// and the suggester's uncertainty about each document without gold.
export async function up(knex: Knex): Promise<void> {
  const tenant = (t: Knex.CreateTableBuilder) =>
    t.uuid("organization_id").notNullable().references("id").inTable("organizations").onDelete("CASCADE");

  await knex.schema.createTable("api_tokens", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    tenant(t);
    t.text("name").notNullable();
    t.text("prefix").notNullable();
    t.text("token_hash").notNullable().unique();
    t.text("created_by").references("id").inTable("auth_user").onDelete("SET NULL");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("last_used_at", { useTz: true });
    t.timestamp("revoked_at", { useTz: true });
    t.index(["organization_id", "created_at"]);
  });

  await knex.schema.createTable("suggestion_runs", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    tenant(t);
    t.uuid("corpus_id").notNullable().references("id").inTable("corpora").onDelete("CASCADE");
    t.uuid("tagger_id").notNullable().references("id").inTable("taggers").onDelete("CASCADE");
    t.text("reason").notNullable(); // suggester_changed | new_documents
    t.integer("shards_total").notNullable().defaultTo(0);
    t.integer("shards_done").notNullable().defaultTo(0);
    t.integer("documents_total").notNullable().defaultTo(0);
    t.integer("documents_done").notNullable().defaultTo(0);
    t.integer("spans_suggested").notNullable().defaultTo(0);
    t.text("created_by").references("id").inTable("auth_user").onDelete("SET NULL");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("finished_at", { useTz: true });
    t.index(["corpus_id", "created_at"]);
  });

  await knex.schema.alterTable("corpora", (t) => {
    t.uuid("suggester_tagger_id").references("id").inTable("taggers").onDelete("SET NULL");
    t.timestamp("suggester_changed_at", { useTz: true });
    // The run of the current suggester; a shard of an older run writes nothing.
    t.uuid("suggester_run_id");
  });

  await knex.schema.createTable("suggestion_decisions", (t) => {
    t.bigIncrements("id").primary();
    tenant(t);
    t.uuid("corpus_id").notNullable().references("id").inTable("corpora").onDelete("CASCADE");
    t.uuid("document_id").notNullable().references("id").inTable("documents").onDelete("CASCADE");
    t.uuid("assignment_id").notNullable().references("id").inTable("assignments").onDelete("CASCADE");
    t.uuid("tagger_id").notNullable();
    t.integer("start").notNullable();
    t.integer("end").notNullable();
    t.uuid("type_id").notNullable();
    t.double("confidence").notNullable();
    t.text("decision").notNullable(); // accepted | rejected
    t.text("decided_by").references("id").inTable("auth_user").onDelete("SET NULL");
    t.timestamp("decided_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(["assignment_id", "start", "end", "type_id"]);
    t.index(["corpus_id", "tagger_id"]);
  });
  // The suggester's uncertainty about each document without gold (written by the suggestion job
  // beside the suggestions; the "most uncertain" ranking reads it in index order).
  await knex.schema.createTable("document_uncertainty", (t) => {
    t.uuid("document_id").primary().references("id").inTable("documents").onDelete("CASCADE");
    tenant(t);
    t.uuid("corpus_id").notNullable().references("id").inTable("corpora").onDelete("CASCADE");
    t.uuid("tagger_id").notNullable().references("id").inTable("taggers").onDelete("CASCADE");
    t.double("mean_entropy").notNullable();
    t.double("least_confidence").notNullable();
    t.integer("spans").notNullable();
    t.specificType("span_confidences", "double precision[]").notNullable();
    t.timestamp("scored_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(["corpus_id", "tagger_id", "mean_entropy"]);
  });
  await knex.raw("ALTER TABLE suggestion_decisions ADD CONSTRAINT suggestion_decisions_check CHECK (decision IN ('accepted','rejected'))");
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists("document_uncertainty");
  await knex.schema.dropTableIfExists("suggestion_decisions");
  await knex.schema.alterTable("corpora", (t) => {
    t.dropColumn("suggester_run_id");
    t.dropColumn("suggester_changed_at");
    t.dropColumn("suggester_tagger_id");
  });
  await knex.schema.dropTableIfExists("suggestion_runs");
  await knex.schema.dropTableIfExists("api_tokens");
}
