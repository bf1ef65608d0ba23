import knexFactory, { type Knex } from "knex";
import pg from "pg";
import { env } from "@/config/env";
import { logger } from "@/logger";

// Return BIGINT counts as numbers and keep DATE columns as strings (no time-zone shifts).
pg.types.setTypeParser(pg.types.builtins.INT8, (v) => Number(v));
pg.types.setTypeParser(pg.types.builtins.DATE, (v) => v);

/** Builds a Knex instance for a PostgreSQL URL. */
export function createKnex(url: string, pool: { min: number; max: number } = { min: 0, max: 10 }): Knex {
  return knexFactory({
    client: "pg",
    connection: url,
    pool,
    acquireConnectionTimeout: 10_000,
    // Knex writes its warnings (a pooled connection cut when PostgreSQL restarts, which it then
    // replaces) with console.log; send them to the process logger as JSON like everything else.
    log: {
      warn: (message: unknown) => logger.warn({ knex: String(message) }, "database client warning"),
      error: (message: unknown) => logger.error({ knex: String(message) }, "database client error"),
      deprecate: (method: unknown, alternative: unknown) => logger.warn({ knex: `${String(method)} is deprecated; use ${String(alternative)}` }, "database client warning"),
      debug: (message: unknown) => logger.debug({ knex: message }, "database client debug"),
    },
  });
}

/** The single Knex instance of this process. */
export const db: Knex = createKnex(env.DATABASE_URL);

/** True when the database answers a real query within the timeout. */
export async function isDatabaseUp(knex: Knex = db, timeoutMs = 2000): Promise<boolean> {
  try {
    await Promise.race([
      knex.raw("select 1 as ok"),
      new Promise((_, reject) => setTimeout(() => reject(new Error("database timeout")), timeoutMs).unref()),
    ]);
    return true;
  } catch {
    return false;
  }
}
