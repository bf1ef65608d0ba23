import type { EntityType, Span } from "@tagloom/contracts";
import { type ReactNode, useMemo } from "react";
import { cn } from "@/lib/cn";
import { SpanMark, UNKNOWN_TYPE_COLOR } from "./span-mark";
import { typeCodes } from "./type-codes";

type Piece = { text: string; span?: Span };

/** The text of [from, to) cut into plain pieces and span pieces (spans sorted; overlaps and spans outside skipped). */
export function pieceText(text: string, spans: readonly Span[], from = 0, to = text.length): Piece[] {
  const pieces: Piece[] = [];
  let at = from;
  for (const span of [...spans].sort((a, b) => a.start - b.start || a.end - b.end)) {
    if (span.start < at || span.end > to) continue;
    if (span.start > at) pieces.push({ text: text.slice(at, span.start) });
    pieces.push({ text: text.slice(span.start, span.end), span });
    at = span.end;
  }
  if (at < to) pieces.push({ text: text.slice(at, to) });
  return pieces;
}

/** Colours and codes of a schema's types, for SpanMark. */
export function useSpanStyles(types: readonly Pick<EntityType, "name" | "color">[]) {
  return useMemo(() => {
    const colors = new Map(types.map((t) => [t.name, t.color]));
    return { colors, codes: typeCodes(types.map((t) => t.name)) };
  }, [types]);
}

type Props = {
  text: string;
  spans: readonly Span[];
  types: readonly Pick<EntityType, "name" | "color">[];
  /** Show only this stretch of the text, with "…" where it is cut. */
  from?: number;
  to?: number;
  className?: string;
  "data-testid"?: string;
};

/** Read-only text with its spans drawn in Tagloom's span look (document page, gold view, review, comparisons). */
export function SpanText({ text, spans, types, from = 0, to = text.length, className, ...rest }: Props) {
  const { colors, codes } = useSpanStyles(types);
  const out: ReactNode[] = pieceText(text, spans, from, to).map((p, i) =>
    p.span ? (
      <SpanMark key={i} type={p.span.type} code={codes.get(p.span.type) ?? p.span.type.slice(0, 4).toUpperCase()} color={colors.get(p.span.type) ?? UNKNOWN_TYPE_COLOR}>
        {p.text}
      </SpanMark>
    ) : (
      <span key={i}>{p.text}</span>
    ),
  );
  return (
    <span className={cn("leading-[2.3] whitespace-pre-wrap", className)} data-testid={rest["data-testid"]}>
      {from > 0 ? "…" : null}
      {out}
      {to < text.length ? "…" : null}
    </span>
  );
}
