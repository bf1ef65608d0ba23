import fs from "node:fs";
import path from "node:path";
import { pathToFileURL } from "node:url";
import type { Knex } from "knex";
import { repoRoot } from "@/config/env";

export const migrationsDir = path.join(repoRoot, "migrations");

type MigrationModule = { up: (knex: Knex) => Promise<void>; down: (knex: Knex) => Promise<void>; config?: object };

/**
 * Lists the TypeScript migrations of the root `migrations/` folder and loads them with a plain
 * dynamic import, so that the same files run under tsx (start) and under vitest (tests), which
 * Knex's own file loader cannot do for .ts files.
 */
export const migrationSource: Knex.MigrationSource<string> = {
  async getMigrations() {
    return fs
      .readdirSync(migrationsDir)
      .filter((f) => /^\d{14}_[a-z0-9_-]+\.ts$/.test(f))
      .sort();
  },
  getMigrationName(name) {
    return name;
  },
  async getMigration(name) {
    return (await import(pathToFileURL(path.join(migrationsDir, name)).href)) as MigrationModule;
  },
};

/** Runs every pending migration. */
export async function migrateLatest(knex: Knex): Promise<string[]> {
  const [, names] = (await knex.migrate.latest({ migrationSource })) as [number, string[]];
  return names;
}
