import pg from "pg";
import { env } from "@/config/env";
import { logger } from "@/logger";

/** A small node-postgres pool for libraries that want one (the session adapter). */
export const pgPool = new pg.Pool({ connectionString: env.DATABASE_URL, max: 5 });

// An idle client whose server went away (PostgreSQL restarted, connection cut) emits "error" on
// the pool; without a listener Node treats it as unhandled and the process exits. The pool drops
// that client and opens a new one on the next query, so logging is all there is to do.
pgPool.on("error", (err) => {
  logger.warn({ err }, "an idle PostgreSQL connection of the session pool failed; it will be replaced");
});
