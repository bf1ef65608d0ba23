import type { Knex } from "knex";

/** Either the process's Knex instance or a transaction: repositories accept both. */
export type Db = Knex | Knex.Transaction;

/** ISO-8601 text of a timestamp column value. */
export function iso(value: Date | string | null | undefined): string | null {
  if (value === null || value === undefined) return null;
  return (value instanceof Date ? value : new Date(value)).toISOString();
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
/** True for a canonical UUID; anything else in a URL is answered 404 before reaching SQL. */
export function isUuid(value: unknown): value is string {
  return typeof value === "string" && UUID.test(value);
}
