import type { EntityType } from "@tagloom/contracts";
import { type KeyboardEvent, useEffect, useRef } from "react";
import { cn } from "@/lib/cn";
import type { AnnotationStore } from "../lib/annotation-store";
import { baseKey } from "../lib/keymap";
import type { MenuRequest } from "./document-text";

type Item = { label: string; hint?: string; color?: string; danger?: boolean; run: () => void };

/** The menu of a selection, a span or a suggestion: types to pick, remove, accept or reject. */
export function SpanMenu({ store, request, onClose }: { store: AnnotationStore; request: MenuRequest; onClose: () => void }) {
  const ref = useRef<HTMLDivElement>(null);
  const typeItem = (t: EntityType, run: () => void, prefix = ""): Item => ({ label: `${prefix}${t.name}`, hint: t.hotkey ?? undefined, color: t.color, run });
  let title: string;
  let items: Item[];
  if (request.kind === "label") {
    title = `Mark "${clip(store.selectionText())}" as`;
    items = store.types.map((t) => typeItem(t, () => store.label(t.name)));
  } else if (request.kind === "span") {
    const { span } = request;
    title = `"${clip(store.doc.text.slice(span.start, span.end))}" is ${span.type}`;
    items = [
      ...store.types.filter((t) => t.name !== span.type).map((t) => typeItem(t, () => store.setSpanType(span, t.name), "Change to ")),
      { label: "Remove span", hint: "Del", danger: true, run: () => store.removeSpan(span) },
    ];
  } else {
    const { suggestion } = request;
    title = `Suggestion: ${suggestion.type}, ${Math.round(suggestion.confidence * 100)}% confident`;
    items = [
      { label: `Accept as ${suggestion.type}`, hint: "Enter", color: store.typeByName.get(suggestion.type)?.color, run: () => store.acceptSuggestions([suggestion]) },
      ...store.types.filter((t) => t.name !== suggestion.type).map((t) => typeItem(t, () => store.acceptSuggestions([suggestion], t.name), "Accept as ")),
      { label: "Reject suggestion", hint: "Del", danger: true, run: () => store.rejectSuggestions([suggestion]) },
    ];
  }

  useEffect(() => {
    ref.current?.querySelector<HTMLButtonElement>("[role=menuitem]")?.focus();
  }, []);
  useEffect(() => {
    const away = (e: PointerEvent) => {
      if (!ref.current?.contains(e.target as Node)) onClose();
    };
    window.addEventListener("pointerdown", away, true);
    return () => window.removeEventListener("pointerdown", away, true);
  }, [onClose]);

  const run = (item: Item) => {
    item.run();
    onClose();
  };
  const onKeyDown = (e: KeyboardEvent<HTMLDivElement>) => {
    const buttons = [...(ref.current?.querySelectorAll<HTMLButtonElement>("[role=menuitem]") ?? [])];
    const at = buttons.indexOf(document.activeElement as HTMLButtonElement);
    if (e.key === "Escape") onClose();
    else if (e.key === "ArrowDown") buttons[(at + 1) % buttons.length]?.focus();
    else if (e.key === "ArrowUp") buttons[(at - 1 + buttons.length) % buttons.length]?.focus();
    else if ((e.key === "Delete" || e.key === "Backspace") && request.kind !== "label") run(items[items.length - 1]!);
    else {
      const type = store.typeByKey.get(baseKey(e));
      const item = type && items.find((i) => i.label.endsWith(type.name) && !i.danger);
      if (!item) return;
      run(item);
    }
    e.preventDefault();
    e.stopPropagation();
  };

  const left = Math.min(request.x, window.innerWidth - 280);
  const top = Math.min(request.y, window.innerHeight - 48 - items.length * 36);
  return (
    <div
      ref={ref}
      role="menu"
      aria-label={title}
      onKeyDown={onKeyDown}
      className="fixed z-40 w-64 rounded-lg border border-ink-100 bg-white p-1 shadow-lg"
      style={{ left: Math.max(8, left), top: Math.max(8, top) }}
    >
      <p className="truncate px-2 py-1.5 text-xs font-medium text-ink-500">{title}</p>
      {items.map((item) => (
        <button
          key={item.label}
          type="button"
          role="menuitem"
          onClick={() => run(item)}
          className={cn(
            "flex w-full items-center gap-2 rounded-md px-2 py-1.5 text-left text-sm hover:bg-ink-50 focus:bg-ink-50 focus:outline-none",
            item.danger ? "text-rust-500" : "text-ink-800",
          )}
        >
          {item.color ? <span aria-hidden className="size-3 shrink-0 rounded-sm" style={{ backgroundColor: item.color }} /> : <span className="size-3 shrink-0" />}
          <span className="flex-1">{item.label}</span>
          {item.hint ? <kbd className="rounded border border-ink-100 bg-ink-50 px-1.5 font-mono text-[11px] text-ink-500">{item.hint}</kbd> : null}
        </button>
      ))}
    </div>
  );
}

function clip(s: string, max = 40): string {
  return s.length > max ? `${s.slice(0, max - 1)}…` : s;
}
