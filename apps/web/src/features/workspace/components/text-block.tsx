import type { SuggestedSpan } from "@tagloom/contracts";
import { type ReactNode, memo, useSyncExternalStore } from "react";
import { SpanMark, UNKNOWN_TYPE_COLOR } from "@/components/spans";
import { cn } from "@/lib/cn";
import { type AnnotationStore, type WorkSpan, spanKey } from "../lib/annotation-store";

type Props = { store: AnnotationStore; index: number; colors: ReadonlyMap<string, string>; codes: ReadonlyMap<string, string> };

/**
 * One row of the document (a paragraph or part of one). It subscribes to its own version number
 * in the store, so a change elsewhere in the document never re-renders it.
 */
export const TextBlock = memo(function TextBlock({ store, index, colors, codes }: Props) {
  useSyncExternalStore(store.subscribe, () => store.blockVersion(index));
  const { doc } = store;
  const block = doc.blocks[index]!;
  const { spans, suggestions } = store.spansInBlock(index);
  const [selFrom, selTo] = store.selection;
  const selecting = store.anchor !== null;
  const cursor = store.cursor;

  const token = (t: number) => (
    <span
      key={t}
      data-t={t}
      className={cn(
        "rounded-[2px]",
        selecting && t >= selFrom && t <= selTo && "bg-ink-200/80",
        t === cursor && "outline-2 outline-offset-1 outline-thread-500",
      )}
    >
      {doc.text.slice(doc.starts[t], doc.ends[t])}
    </span>
  );
  const gapBefore = (t: number): string | null => (t > block.firstToken ? doc.text.slice(doc.ends[t - 1], doc.starts[t]) : null);

  const out: ReactNode[] = [];
  let si = 0;
  let gi = 0;
  let t = block.firstToken;
  while (t < block.endToken) {
    const at = doc.starts[t]!;
    while (si < spans.length && spans[si]!.end <= at) si++;
    while (gi < suggestions.length && suggestions[gi]!.end <= at) gi++;
    const span: WorkSpan | SuggestedSpan | null =
      spans[si] && spans[si]!.start <= at ? spans[si]! : suggestions[gi] && suggestions[gi]!.start <= at ? suggestions[gi]! : null;
    const gap = gapBefore(t);
    if (gap) out.push(gap);
    if (!span) {
      out.push(token(t));
      t++;
      continue;
    }
    const inner: ReactNode[] = [];
    const first = t;
    while (t < block.endToken && doc.starts[t]! < span.end) {
      if (t > first) inner.push(gapBefore(t));
      inner.push(token(t));
      t++;
    }
    const color = colors.get(span.type) ?? UNKNOWN_TYPE_COLOR;
    const code = codes.get(span.type) ?? span.type.slice(0, 4).toUpperCase();
    const continued = span.start < block.start;
    if ("confidence" in span) {
      const pct = Math.round(span.confidence * 100);
      out.push(
        <SpanMark
          key={`s${span.start}`}
          data-suggestion={spanKey(span)}
          type={span.type}
          code={code}
          color={color}
          suggestion={{ confidence: span.confidence }}
          continued={continued}
          title={`Suggestion: ${span.type}, ${pct}% confident. Enter accepts, Delete rejects.`}
          className="cursor-pointer"
        >
          {inner}
        </SpanMark>,
      );
    } else {
      out.push(
        <SpanMark
          key={`m${span.start}`}
          data-span={spanKey(span)}
          type={span.type}
          code={code}
          color={color}
          continued={continued}
          note={span.origin === "suggested" ? "accepted suggestion" : undefined}
          title={`${span.type}${span.origin === "suggested" ? " (accepted suggestion)" : ""}: click to change or remove`}
          className="cursor-pointer"
        >
          {inner}
        </SpanMark>,
      );
    }
  }
  return <p className="m-0 pb-4 leading-[2.2] whitespace-pre-wrap">{out}</p>;
});
