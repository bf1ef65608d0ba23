import type { EntityType, Span } from "@tagloom/contracts";
import { SpanText } from "@/components/spans";

/** A document's text, read-only, with its gold spans in the shared span look. */
export function DocumentText({ text, spans, types }: { text: string; spans: Span[]; types: EntityType[] }) {
  return (
    <div className="rounded-lg border border-ink-100 bg-white p-4 font-serif text-[16px] text-ink-900 sm:p-6" data-testid="document-text">
      <SpanText text={text} spans={spans} types={types} className="block" />
    </div>
  );
}
