import type { SuggestedSpan } from "@tagloom/contracts";
import { useVirtualizer } from "@tanstack/react-virtual";
import { type KeyboardEvent, type PointerEvent, forwardRef, useCallback, useEffect, useImperativeHandle, useRef } from "react";
import { useSpanStyles } from "@/components/spans";
import type { AnnotationStore, WorkSpan } from "../lib/annotation-store";
import { handleWorkspaceKey } from "../lib/keymap";
import { TextBlock } from "./text-block";

export type MenuRequest =
  | { kind: "label"; x: number; y: number }
  | { kind: "span"; x: number; y: number; span: WorkSpan }
  | { kind: "suggestion"; x: number; y: number; suggestion: SuggestedSpan };

export type DocumentTextHandle = { focus: () => void; showCursor: () => void };

type Props = {
  store: AnnotationStore;
  onMenu: (request: MenuRequest) => void;
  onHelp: () => void;
  onGuideline: (typeName: string) => void;
};

function tokenOf(el: Element | null): number | null {
  const hit = el?.closest<HTMLElement>("[data-t]");
  return hit ? Number(hit.dataset.t) : null;
}

/**
 * The document's text, drawn row by row with only the rows on screen in the page. Keys move a
 * token cursor and mark spans; the mouse selects whole tokens by dragging, Shift+click stretches,
 * and a click on a span or suggestion opens its menu.
 */
export const DocumentText = forwardRef<DocumentTextHandle, Props>(function DocumentText({ store, onMenu, onHelp, onGuideline }, ref) {
  const scrollRef = useRef<HTMLDivElement>(null);
  const { doc } = store;
  const { colors, codes } = useSpanStyles(store.types);
  const virtualizer = useVirtualizer({
    count: doc.blocks.length,
    getScrollElement: () => scrollRef.current,
    estimateSize: (i) => {
      const b = doc.blocks[i]!;
      return Math.ceil((b.end - b.start + 1) / 95) * 38 + 16;
    },
    overscan: 6,
  });

  const showCursor = useCallback(() => {
    const block = doc.blockOfToken[store.cursor];
    if (block === undefined) return;
    const el = scrollRef.current?.querySelector<HTMLElement>(`[data-t="${store.cursor}"]`);
    const box = scrollRef.current?.getBoundingClientRect();
    if (el && box) {
      const r = el.getBoundingClientRect();
      if (r.top >= box.top + 8 && r.bottom <= box.bottom - 8) return;
      el.scrollIntoView({ block: "nearest" });
      return;
    }
    virtualizer.scrollToIndex(block, { align: "center" });
  }, [doc, store, virtualizer]);

  useImperativeHandle(ref, () => ({ focus: () => scrollRef.current?.focus({ preventScroll: true }), showCursor }), [showCursor]);

  const openMenuAtCursor = useCallback(() => {
    const el = scrollRef.current?.querySelector<HTMLElement>(`[data-t="${store.cursor}"]`);
    const r = el?.getBoundingClientRect();
    const x = r ? r.left : 200;
    const y = r ? r.bottom + 4 : 200;
    const span = store.anchor === null ? store.spanAtToken(store.cursor) : null;
    onMenu(span ? { kind: "span", x, y, span } : { kind: "label", x, y });
  }, [store, onMenu]);

  const onKeyDown = (e: KeyboardEvent<HTMLDivElement>) => {
    const used = handleWorkspaceKey(e, store, { openMenu: openMenuAtCursor, toggleHelp: onHelp, showGuideline: onGuideline });
    if (!used) return;
    e.preventDefault();
    showCursor();
  };

  const drag = useRef<{ start: number; moved: boolean; span: WorkSpan | null; suggestion: SuggestedSpan | null } | null>(null);
  const onPointerDown = (e: PointerEvent<HTMLDivElement>) => {
    if (e.button !== 0) return;
    const t = tokenOf(e.target as Element);
    if (t === null) return;
    e.preventDefault();
    scrollRef.current?.focus({ preventScroll: true });
    const onSpan = !e.shiftKey && (e.target as Element).closest("[data-span]") ? store.spanAtToken(t) : null;
    const onSuggestion = !e.shiftKey && !onSpan && (e.target as Element).closest("[data-suggestion]") ? store.suggestionAtToken(t) : null;
    store.moveCursor(t, e.shiftKey);
    drag.current = { start: t, moved: e.shiftKey, span: onSpan, suggestion: onSuggestion };
    (e.currentTarget as HTMLElement).setPointerCapture?.(e.pointerId);
  };
  const onPointerMove = (e: PointerEvent<HTMLDivElement>) => {
    const d = drag.current;
    if (!d) return;
    const t = tokenOf(document.elementFromPoint(e.clientX, e.clientY));
    if (t === null || t === store.cursor) return;
    if (!d.moved) store.moveCursor(d.start);
    store.moveCursor(t, true);
    d.moved = true;
  };
  const onPointerUp = (e: PointerEvent<HTMLDivElement>) => {
    const d = drag.current;
    drag.current = null;
    if (!d) return;
    const x = e.clientX;
    const y = e.clientY + 12;
    if (d.moved) onMenu({ kind: "label", x, y });
    else if (d.span) onMenu({ kind: "span", x, y, span: d.span });
    else if (d.suggestion) onMenu({ kind: "suggestion", x, y, suggestion: d.suggestion });
  };

  useEffect(() => {
    if (typeof performance !== "undefined") {
      performance.mark("tagloom:text-mounted");
      requestAnimationFrame(() => performance.mark("tagloom:text-painted"));
    }
  }, []);

  const items = virtualizer.getVirtualItems();
  return (
    <div
      ref={scrollRef}
      tabIndex={0}
      role="application"
      aria-roledescription="annotation text"
      aria-label={`Text of the document. Arrow keys move the cursor, Shift and the arrows select, type keys mark spans.${store.readOnly ? " Read-only." : ""}`}
      onKeyDown={onKeyDown}
      onPointerDown={onPointerDown}
      onPointerMove={onPointerMove}
      onPointerUp={onPointerUp}
      onPointerCancel={() => (drag.current = null)}
      data-testid="document-text"
      className="relative h-full overflow-y-auto rounded-lg border border-ink-100 bg-white px-4 py-4 sm:px-8 sm:py-6 font-serif text-[17px] text-ink-900 select-none focus:outline-none focus-visible:ring-2 focus-visible:ring-thread-300"
    >
      <div style={{ height: virtualizer.getTotalSize(), position: "relative" }}>
        <div style={{ position: "absolute", top: 0, left: 0, right: 0, transform: `translateY(${items[0]?.start ?? 0}px)` }}>
          {items.map((item) => (
            <div key={item.key} data-index={item.index} ref={virtualizer.measureElement}>
              <TextBlock store={store} index={item.index} colors={colors} codes={codes} />
            </div>
          ))}
        </div>
      </div>
    </div>
  );
});
