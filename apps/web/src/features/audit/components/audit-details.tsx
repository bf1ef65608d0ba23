import { countOf } from "@tagloom/contracts";

/** A field name as words: "seatCount" → "seat count", "old_role" → "old role". */
export function fieldName(key: string): string {
  return key.replace(/_/g, " ").replace(/([a-z])([A-Z])/g, "$1 $2").toLowerCase();
}

function fieldValue(value: unknown): string {
  if (value === null || value === undefined) return "—";
  if (typeof value === "string") return value;
  if (typeof value === "number" || typeof value === "boolean") return String(value);
  return JSON.stringify(value, null, 2);
}

/** An event's details folded away behind a summary, opened as a list of fields that wraps in the cell. */
export function AuditDetails({ details, ip }: { details: Record<string, unknown>; ip: string | null }) {
  const entries = Object.entries(details);
  if (entries.length === 0 && !ip) return null;
  return (
    <details className="max-w-xs text-xs text-ink-700">
      <summary className="cursor-pointer text-ink-500 hover:text-ink-800">{countOf(entries.length, "detail")}</summary>
      <dl className="mt-1 space-y-1">
        {entries.map(([k, v]) => (
          <div key={k}>
            <dt className="font-medium text-ink-800">{fieldName(k)}</dt>
            <dd className="break-words whitespace-pre-wrap">{fieldValue(v)}</dd>
          </div>
        ))}
        {ip ? (
          <div>
            <dt className="font-medium text-ink-800">from address</dt>
            <dd>{ip}</dd>
          </div>
        ) : null}
      </dl>
    </details>
  );
}
