import { type CSSProperties, type HTMLAttributes, type ReactNode, Children } from "react";
import { cn } from "@/lib/cn";

/** Colour of a span whose type is not in the schema any more. */
export const UNKNOWN_TYPE_COLOR = "#86a3c2";

type Props = Omit<HTMLAttributes<HTMLElement>, "children"> & {
  /** The entity type's name, always reachable without colour (title and screen-reader text). */
  type: string;
  /** Its short code, printed under the start of the span. */
  code: string;
  color: string;
  /** A tagger's suggestion (dashed bracket, with its confidence) rather than a marked span. */
  suggestion?: { confidence: number } | null;
  /** The span goes on in the next block: the code is printed there, not here. */
  continued?: boolean;
  /** Extra words for the hover text, e.g. "accepted suggestion". */
  note?: string;
  children: ReactNode;
};

/**
 * The span's first word (of a string) or first child (of token elements), and the rest. The code
 * is a zero-width box before the text, and a line may break after a box: kept with the first word
 * in one unbreakable run, the code cannot end one line while its span starts the next.
 */
export function splitHead(children: ReactNode): [ReactNode, ReactNode] {
  if (typeof children === "string") {
    const m = /^\S*/.exec(children)![0];
    return [m, children.slice(m.length)];
  }
  const all = Children.toArray(children);
  return [all[0] ?? null, all.slice(1)];
}

/**
 * One entity span in Tagloom's look: the text stays as it is, a bracket in the type's colour runs
 * under it (a line with a short upright tick at each end), and the type's short code hangs from
 * the left tick on a second line, in ink so it reads on any colour. Suggestions draw the same
 * bracket dashed and add their confidence to the code. Every screen that shows spans draws them
 * with this component (workspace, document page, gold view, review, comparisons).
 */
export function SpanMark({ type, code, color, suggestion, continued, note, className, style, title, children, ...rest }: Props) {
  const pct = suggestion ? Math.round(suggestion.confidence * 100) : null;
  const label = suggestion ? `Suggestion: ${type}, ${pct}% confident` : `${type}${note ? ` (${note})` : ""}`;
  const Tag = suggestion ? "span" : "mark";
  const [head, tail] = continued ? [null, children] : splitHead(children);
  return (
    <Tag
      {...rest}
      data-type={type}
      title={title ?? label}
      className={cn("tl-span", suggestion && "tl-span-suggested", className)}
      style={{ ...style, "--span-color": color } as CSSProperties}
    >
      {continued ? null : (
        <span className="tl-span-head">
          <span aria-hidden className="tl-span-code">
            <span>
              {code}
              {pct === null ? null : <span className="tl-span-pct"> {pct}%</span>}
            </span>
          </span>
          {head}
        </span>
      )}
      {tail}
      <span className="sr-only"> ({label})</span>
    </Tag>
  );
}
