import type { AnnotatedSpan, EntityType, Span, SuggestedSpan } from "@tagloom/contracts";
import type { StoredSpan } from "./assignments.repository";

/** The corpus's entity types by id and by name. */
export type TypeIndex = { byId: Map<string, EntityType>; byName: Map<string, EntityType>; names: Set<string> };

export function indexTypes(types: readonly EntityType[]): TypeIndex {
  return {
    byId: new Map(types.map((t) => [t.id, t])),
    byName: new Map(types.map((t) => [t.name, t])),
    names: new Set(types.map((t) => t.name)),
  };
}

/** Stored spans (type ids) as API spans (type names); spans of deleted types are left out. */
export function namedSpans(stored: readonly StoredSpan[], types: TypeIndex): AnnotatedSpan[] {
  return stored.flatMap((s) => {
    const t = types.byId.get(s.typeId);
    return t ? [{ start: s.start, end: s.end, type: t.name, origin: s.origin ?? "human" }] : [];
  });
}

/** Like namedSpans, without the origin. */
export function plainSpans(stored: readonly StoredSpan[], types: TypeIndex): Span[] {
  return namedSpans(stored, types).map(({ start, end, type }) => ({ start, end, type }));
}

/** API spans as stored spans, sorted by offset. The types must have been checked. */
export function storedSpans(spans: ReadonlyArray<Span & { origin?: AnnotatedSpan["origin"] }>, types: TypeIndex): StoredSpan[] {
  return [...spans]
    .sort((a, b) => a.start - b.start || a.end - b.end)
    .map((s) => {
      const out: StoredSpan = { start: s.start, end: s.end, typeId: types.byName.get(s.type)!.id };
      if (s.origin === "suggested") out.origin = "suggested";
      return out;
    });
}

const storedKey = (s: StoredSpan) => `${s.start}:${s.end}:${s.typeId}:${s.origin ?? "human"}`;

/** True when two lists of stored spans hold the same spans (in any order). */
export function sameStoredSpans(a: readonly StoredSpan[], b: readonly StoredSpan[]): boolean {
  if (a.length !== b.length) return false;
  const x = a.map(storedKey).sort();
  const y = b.map(storedKey).sort();
  return x.every((k, i) => k === y[i]);
}

const key = (s: { start: number; end: number; type: string }) => `${s.start}:${s.end}:${s.type}`;

/** The suggestions still to decide: neither dismissed nor already marked as a span. */
export function pendingSuggestions(suggestions: readonly SuggestedSpan[], spans: readonly Span[], dismissed: readonly Span[]): SuggestedSpan[] {
  const decided = new Set([...spans.map(key), ...dismissed.map(key)]);
  return suggestions.filter((s) => !decided.has(key(s)));
}
