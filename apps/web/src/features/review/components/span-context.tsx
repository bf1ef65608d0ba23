import type { Span } from "@tagloom/contracts";
import type { ReactNode } from "react";

/** A stretch of the text around [start, end) with the given spans highlighted in their type's colour. */
export function SpanContext({ text, start, end, spans, colors, pad = 60 }: { text: string; start: number; end: number; spans: readonly Span[]; colors: ReadonlyMap<string, string>; pad?: number }) {
  const from = Math.max(0, start - pad);
  const to = Math.min(text.length, end + pad);
  const parts: ReactNode[] = [];
  let at = from;
  for (const s of [...spans].sort((a, b) => a.start - b.start)) {
    if (s.end <= from || s.start >= to || s.start < at) continue;
    parts.push(text.slice(at, s.start));
    const color = colors.get(s.type) ?? "#86a3c2";
    parts.push(
      <mark key={`${s.start}:${s.end}:${s.type}`} className="rounded-sm px-0.5" style={{ backgroundColor: `${color}40`, boxShadow: `inset 0 -2px 0 ${color}` }}>
        {text.slice(s.start, s.end)}
        <span className="ml-1 text-[10px] font-bold">{s.type}</span>
      </mark>,
    );
    at = s.end;
  }
  parts.push(text.slice(at, to));
  return (
    <span className="font-serif whitespace-pre-wrap">
      {from > 0 ? "…" : ""}
      {parts}
      {to < text.length ? "…" : ""}
    </span>
  );
}
