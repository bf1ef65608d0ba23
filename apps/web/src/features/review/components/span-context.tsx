import type { EntityType, Span } from "@tagloom/contracts";
import { SpanText, excerptBounds } from "@/components/spans";

/** A stretch of the text around [start, end), cut at word edges, with the given spans in the shared span look. */
export function SpanContext({ text, start, end, spans, types, pad = 60 }: { text: string; start: number; end: number; spans: readonly Span[]; types: readonly Pick<EntityType, "name" | "color">[]; pad?: number }) {
  const { from, to } = excerptBounds(text, start, end, pad);
  return <SpanText text={text} spans={spans} types={types} from={from} to={to} className="font-serif" />;
}
