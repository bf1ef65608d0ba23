import type { TestProject } from "vitest/node";
import { startTempPostgres } from "../../../../docker-free-scripts/lib/temp-postgres.mjs";

declare module "vitest" {
  export interface ProvidedContext {
    pgAdminUrl: string;
    pgTemplate: string;
  }
}

/**
 * One throwaway PostgreSQL for the whole API test run. Migrations (and pg-boss's own schema) are
 * applied once to a template database; every test file then gets a fresh copy of it.
 */
export default async function setup(project: TestProject): Promise<() => Promise<void>> {
  const pg = await startTempPostgres({ label: "api" });
  const template = "tagloom_template";
  const { default: knexFactory } = await import("knex");
  const admin = knexFactory({ client: "pg", connection: pg.url, pool: { min: 0, max: 1 } });
  await admin.raw(`CREATE DATABASE ${template}`);
  await admin.destroy();

  process.env.DATABASE_URL = pg.urlFor(template);
  process.env.NODE_ENV = "test";
  const { migrateLatest } = await import("../../src/db/migration-source");
  const { db } = await import("../../src/db/knex");
  await migrateLatest(db);
  const { default: PgBoss } = await import("pg-boss");
  const boss = new PgBoss({ connectionString: pg.urlFor(template), supervise: false, schedule: false });
  await boss.start();
  await boss.stop({ graceful: false, wait: true });
  await db.destroy();

  project.provide("pgAdminUrl", pg.url);
  project.provide("pgTemplate", template);
  return async () => pg.stop();
}
