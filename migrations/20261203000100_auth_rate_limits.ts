import type { Knex } from "knex";

// Sign-in, sign-up and reset attempt counters, shared by every API process (rate-limiter-flexible's
// PostgreSQL store; its columns: key, points used, expiry in ms since the epoch). Not customer data.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("auth_rate_limits", (t) => {
    t.string("key", 255).primary();
    t.integer("points").notNullable().defaultTo(0);
    t.bigInteger("expire");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("auth_rate_limits");
}
