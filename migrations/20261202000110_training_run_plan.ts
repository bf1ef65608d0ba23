import type { Knex } from "knex";

// The plan of a sharded run (merged word and tag counts of pass 1), written once by the job that
// loads the documents and read by every shard job of pass 2. Kept as text: it can be megabytes.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("training_runs", (t) => {
    t.text("plan");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("training_runs", (t) => {
    t.dropColumn("plan");
  });
}
