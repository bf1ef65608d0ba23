import { unstorableTextReason } from "@tagloom/contracts";
import { ValidationError } from "@/errors";

/** A timestamp as PostgreSQL prints it (`2026-12-01 10:00:00.123456+00`), exact to the microsecond. */
const PG_TIMESTAMP = /^(\d{4})-(\d{2})-(\d{2})[ T](\d{2}):(\d{2}):(\d{2})(\.\d{1,6})?(?:([+-])(\d{2})(?::?(\d{2}))?|Z)?$/;

/** Largest integer a cursor may carry: the int4 columns sorted on (token counts) hold no more. */
export const MAX_CURSOR_INTEGER = 2 ** 31 - 1;

/**
 * True when the text is a real instant PostgreSQL accepts: the format above and a calendar date
 * and clock time that exist (no month 13, hour 25 or 30 February), offset within ±15:59.
 */
export function isRealTimestamp(value: string): boolean {
  const m = PG_TIMESTAMP.exec(value);
  if (!m) return false;
  const [year, month, day, hour, minute, second] = m.slice(1, 7).map(Number) as [number, number, number, number, number, number];
  if (year < 1 || month < 1 || month > 12 || day < 1 || hour > 23 || minute > 59 || second > 59) return false;
  const daysInMonth = new Date(Date.UTC(year, month, 0)).getUTCDate();
  if (day > daysInMonth) return false;
  if (m[8] !== undefined && (Number(m[9]) > 15 || Number(m[10] ?? 0) > 59)) return false;
  return true;
}
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export type CursorKind = "timestamp" | "text" | "integer";

/** An opaque cursor for keyset pagination: the last row's sort value and id. */
export function encodePageCursor(value: string | number, id: string): string {
  return Buffer.from(JSON.stringify([value, id])).toString("base64url");
}

/** Decodes a cursor made by encodePageCursor; a forged or stale one answers 400. */
export function decodePageCursor(
  cursor: string | undefined,
  kind: CursorKind,
  idIs: "uuid" | "text" = "uuid",
): { value: string | number; id: string } | undefined {
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
  if (typeof id !== "string" || (idIs === "uuid" ? !UUID.test(id) : id.length > 200 || unstorableTextReason(id) !== null)) throw invalid();
  if (kind === "integer" && !(typeof value === "number" && Number.isSafeInteger(value) && Math.abs(value) <= MAX_CURSOR_INTEGER)) throw invalid();
  if (kind === "timestamp" && !(typeof value === "string" && isRealTimestamp(value))) throw invalid();
  if (kind === "text" && !(typeof value === "string" && value.length <= 1000 && unstorableTextReason(value) === null)) throw invalid();
  return { value: value as string | number, id };
}
