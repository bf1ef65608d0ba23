import { ValidationError } from "@/errors";

/** A timestamp as PostgreSQL prints it (`2026-12-01 10:00:00.123456+00`), exact to the microsecond. */
const PG_TIMESTAMP = /^\d{4}-\d{2}-\d{2}[ T]\d{2}:\d{2}:\d{2}(\.\d{1,6})?([+-]\d{2}(:?\d{2})?|Z)?$/;
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export type CursorKind = "timestamp" | "text" | "integer";

/** An opaque cursor for keyset pagination: the last row's sort value and id. */
export function encodePageCursor(value: string | number, id: string): string {
  return Buffer.from(JSON.stringify([value, id])).toString("base64url");
}

/** Decodes a cursor made by encodePageCursor; a forged or stale one answers 400. */
export function decodePageCursor(cursor: string | undefined, kind: CursorKind): { value: string | number; id: string } | undefined {
  if (!cursor) return undefined;
  const invalid = () => new ValidationError("The cursor is not valid.", { fields: { cursor: ["Invalid cursor; start from the first page."] } });
  let parsed: unknown;
  try {
    parsed = JSON.parse(Buffer.from(cursor, "base64url").toString("utf8"));
  } catch {
    throw invalid();
  }
  if (!Array.isArray(parsed) || parsed.length !== 2) throw invalid();
  const [value, id] = parsed as [unknown, unknown];
  if (typeof id !== "string" || !UUID.test(id)) throw invalid();
  if (kind === "integer" && !(typeof value === "number" && Number.isInteger(value))) throw invalid();
  if (kind === "timestamp" && !(typeof value === "string" && PG_TIMESTAMP.test(value))) throw invalid();
  if (kind === "text" && !(typeof value === "string" && value.length <= 1000)) throw invalid();
  return { value: value as string | number, id };
}
