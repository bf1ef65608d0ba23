import type { EntityType, Span } from "@tagloom/contracts";
import { SpanText } from "@/components/spans";

// How far past the padding a cut may move to reach a space, so a long word is not shown whole.
const WORD_SLACK = 20;

/** Moves a cut at `at` outwards (by `dir`) to the nearest space, so the excerpt shows whole words. */
function toWordEdge(text: string, at: number, dir: -1 | 1): number {
  let i = at;
  for (let n = 0; n < WORD_SLACK; n++) {
    if (dir < 0 ? i <= 0 || /\s/.test(text[i - 1]!) : i >= text.length || /\s/.test(text[i]!)) return i;
    i += dir;
  }
  return at;
}

/** A stretch of the text around [start, end), cut at word edges, with the given spans in the shared span look. */
export function SpanContext({ text, start, end, spans, types, pad = 60 }: { text: string; start: number; end: number; spans: readonly Span[]; types: readonly Pick<EntityType, "name" | "color">[]; pad?: number }) {
  const from = toWordEdge(text, Math.max(0, start - pad), -1);
  const to = toWordEdge(text, Math.min(text.length, end + pad), 1);
  return <SpanText text={text} spans={spans} types={types} from={from} to={to} className="font-serif" />;
}
