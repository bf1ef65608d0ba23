import type { EntityType, Span } from "@tagloom/contracts";
import { readableTextColor, withAlpha } from "@/lib/colors";

type Piece = { text: string; span?: Span; type?: EntityType };

/** The text cut into plain pieces and span pieces (spans sorted, flat; unknown types shown plain). */
export function pieceText(text: string, spans: Span[], types: EntityType[]): Piece[] {
  const byName = new Map(types.map((t) => [t.name, t]));
  const pieces: Piece[] = [];
  let at = 0;
  for (const span of [...spans].sort((a, b) => a.start - b.start)) {
    if (span.start < at) continue;
    if (span.start > at) pieces.push({ text: text.slice(at, span.start) });
    pieces.push({ text: text.slice(span.start, span.end), span, type: byName.get(span.type) });
    at = span.end;
  }
  if (at < text.length) pieces.push({ text: text.slice(at) });
  return pieces;
}

/** A document's text, read-only, with its gold spans highlighted in their types' colours. */
export function DocumentText({ text, spans, types }: { text: string; spans: Span[]; types: EntityType[] }) {
  return (
    <div className="rounded-lg border border-ink-100 bg-white p-6 text-[15px] leading-8 whitespace-pre-wrap text-ink-900" data-testid="document-text">
      {pieceText(text, spans, types).map((p, i) =>
        p.span ? (
          <mark
            key={i}
            data-type={p.span.type}
            title={p.span.type}
            className="rounded px-0.5 py-0.5"
            style={{ background: withAlpha(p.type?.color ?? "#999999", 0.35), boxShadow: `inset 0 -2px 0 ${p.type?.color ?? "#999999"}`, color: "inherit" }}
          >
            {p.text}
            <sup
              className="ml-0.5 rounded px-1 font-mono text-[10px] font-semibold"
              style={{ background: p.type?.color ?? "#999999", color: readableTextColor(p.type?.color ?? "#999999") }}
            >
              {p.span.type}
            </sup>
          </mark>
        ) : (
          <span key={i}>{p.text}</span>
        ),
      )}
    </div>
  );
}
