import pg from "pg";
import { env } from "@/config/env";

/** A small node-postgres pool for libraries that want one (the session adapter). */
export const pgPool = new pg.Pool({ connectionString: env.DATABASE_URL, max: 5 });
