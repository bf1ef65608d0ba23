import type { Knex } from "knex";

// Training runs and the taggers they yield. A run records exactly which documents it used and the
// version of each document's gold, so that "repeat" can rebuild the same tagger; gold therefore
// gets a version number that every write bumps. Taggers keep the model as TEXT, not jsonb: jsonb
// reorders keys, and a downloaded tagger must be byte-identical to the one the run produced.
// Shards hold the counts of one slice of a run's training documents until one job sums them.
export async function up(knex: Knex): Promise<void> {
  const tenant = (t: Knex.CreateTableBuilder) =>
    t.uuid("organization_id").notNullable().references("id").inTable("organizations").onDelete("CASCADE");

  await knex.schema.alterTable("document_gold", (t) => {
    t.integer("version").notNullable().defaultTo(1);
  });

  await knex.schema.createTable("training_runs", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    tenant(t);
    t.uuid("corpus_id").notNullable().references("id").inTable("corpora").onDelete("CASCADE");
    t.integer("number").notNullable(); // 1, 2, … per corpus
    t.text("status").notNullable().defaultTo("queued"); // queued | running | succeeded | failed | cancelled
    t.text("stage"); // see runStageNames in @tagloom/contracts; null while queued
    t.jsonb("config").notNullable(); // the resolved engine config plus the run options
    t.integer("seed").notNullable();
    t.jsonb("test_split").notNullable(); // { kind: "corpus" } | { kind: "holdout", percent }
    t.double("progress").notNullable().defaultTo(0); // 0..1
    t.jsonb("iterations").notNullable().defaultTo("[]"); // unlabelled iterations: log-likelihood, seconds, bytes
    t.jsonb("log").notNullable().defaultTo("[]"); // [{ stage, at, seconds }]
    t.jsonb("document_counts").notNullable().defaultTo('{"train":0,"test":0,"unlabelled":0}');
    t.integer("shard_count").notNullable().defaultTo(1);
    t.text("error"); // a sentence a data lead understands
    t.boolean("cancel_requested").notNullable().defaultTo(false);
    t.uuid("repeat_of").references("id").inTable("training_runs").onDelete("SET NULL");
    t.text("created_by").references("id").inTable("auth_user").onDelete("SET NULL");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("started_at", { useTz: true });
    t.timestamp("finished_at", { useTz: true });
    t.timestamp("updated_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(["corpus_id", "number"]);
    t.index(["corpus_id", "created_at", "id"]);
    t.index(["organization_id"]);
  });
  await knex.raw(
    "ALTER TABLE training_runs ADD CONSTRAINT training_runs_status_check CHECK (status IN ('queued','running','succeeded','failed','cancelled'))",
  );

  // The documents a run used, in the order it used them, with the gold version it read. No
  // foreign key to documents: the record outlives a deleted document.
  await knex.schema.createTable("training_run_documents", (t) => {
    t.uuid("run_id").notNullable().references("id").inTable("training_runs").onDelete("CASCADE");
    tenant(t);
    t.uuid("document_id").notNullable();
    t.text("role").notNullable(); // train | test | unlabelled
    t.integer("position").notNullable(); // order within the role
    t.integer("gold_version"); // null for unlabelled documents
    t.integer("shard").notNullable().defaultTo(0);
    t.primary(["run_id", "document_id"]);
    t.index(["run_id", "role", "position"]);
  });
  await knex.raw(
    "ALTER TABLE training_run_documents ADD CONSTRAINT training_run_documents_role_check CHECK (role IN ('train','test','unlabelled'))",
  );

  // Counts of one shard, written by its job; the summing job reads every shard of the run.
  await knex.schema.createTable("training_run_shards", (t) => {
    t.uuid("run_id").notNullable().references("id").inTable("training_runs").onDelete("CASCADE");
    tenant(t);
    t.integer("shard").notNullable();
    t.integer("document_count").notNullable().defaultTo(0);
    t.integer("token_count").notNullable().defaultTo(0);
    t.binary("statistics"); // null until the shard's job has counted it
    t.timestamp("finished_at", { useTz: true });
    t.primary(["run_id", "shard"]);
  });

  await knex.schema.createTable("taggers", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    tenant(t);
    t.uuid("corpus_id").notNullable().references("id").inTable("corpora").onDelete("CASCADE");
    // One tagger per run at most: a retried storing job finds the tagger instead of adding one.
    t.uuid("run_id").unique().references("id").inTable("training_runs").onDelete("SET NULL");
    t.integer("version").notNullable(); // 1, 2, … per corpus
    t.text("model").notNullable(); // serializeModel output, byte for byte
    t.text("model_sha256").notNullable();
    t.jsonb("evaluation").notNullable();
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(["corpus_id", "version"]);
    t.index(["organization_id"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists("taggers");
  await knex.schema.dropTableIfExists("training_run_shards");
  await knex.schema.dropTableIfExists("training_run_documents");
  await knex.schema.dropTableIfExists("training_runs");
  await knex.schema.alterTable("document_gold", (t) => {
    t.dropColumn("version");
  });
}
