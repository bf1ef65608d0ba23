import { db as defaultDb } from "@/db/knex";
import { retryOnConflict } from "@/db/retry";
import type { Db } from "@/db/types";

export type Organization = { id: string; name: string; createdAt: Date };

export async function insertOrganization(name: string, db: Db = defaultDb): Promise<Organization> {
  const [row] = await db("organizations").insert({ name }).returning(["id", "name", "created_at"]);
  return { id: row.id, name: row.name, createdAt: row.created_at };
}

export async function findOrganization(id: string, db: Db = defaultDb): Promise<Organization | null> {
  const row = await db("organizations").where({ id }).first();
  return row ? { id: row.id, name: row.name, createdAt: row.created_at } : null;
}

export async function renameOrganization(id: string, name: string, db: Db = defaultDb): Promise<void> {
  await db("organizations").where({ id }).update({ name });
}

/** Deletes the organization; every tenant table references it with ON DELETE CASCADE. */
/**
 * Deletes the organization and, by ON DELETE CASCADE, all of its data. Jobs may be writing its
 * rows meanwhile (mail, suggestions), which can deadlock with the cascade: outside a transaction
 * the delete is then tried again.
 */
export async function deleteOrganization(id: string, db: Db = defaultDb): Promise<void> {
  const run = () => db("organizations").where({ id }).delete();
  await (db.isTransaction ? run() : retryOnConflict(run));
}
