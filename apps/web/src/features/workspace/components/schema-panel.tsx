import { GuidelineText } from "@/components/markdown/guideline-text";
import { cn } from "@/lib/cn";
import { useSpansVersion } from "../hooks/use-store";
import type { AnnotationStore } from "../lib/annotation-store";

/** The entity schema, always in view: colour, name, key and span count of each type; its guideline on demand. */
export function SchemaPanel({ store, openGuideline, onGuideline }: { store: AnnotationStore; openGuideline: string | null; onGuideline: (name: string | null) => void }) {
  useSpansVersion(store);
  const counts = store.countsByType();
  return (
    <section aria-labelledby="schema-title" className="rounded-lg border border-ink-100 bg-white p-3">
      <h2 id="schema-title" className="px-1 text-xs font-semibold tracking-wide text-ink-500 uppercase">
        Entity types
      </h2>
      <ul className="mt-2 space-y-1">
        {store.types.map((t) => (
          <li key={t.id}>
            <div className="flex items-center gap-2 rounded-md px-1 py-1">
              <button
                type="button"
                disabled={store.readOnly}
                onClick={() => store.label(t.name)}
                className="flex flex-1 items-center gap-2 rounded-md text-left text-sm text-ink-800 hover:bg-ink-50 disabled:cursor-default disabled:hover:bg-transparent"
                title={`Mark the selection as ${t.name}`}
              >
                <span aria-hidden className="size-3.5 shrink-0 rounded-sm" style={{ backgroundColor: t.color }} />
                <span className="font-medium">{t.name}</span>
                <span className="ml-auto text-xs text-ink-500 tabular-nums">{counts.get(t.name) ?? 0}</span>
              </button>
              {t.hotkey ? (
                <kbd title={`Key ${t.hotkey}`} className="rounded border border-ink-200 bg-ink-50 px-1.5 font-mono text-xs text-ink-700">
                  {t.hotkey}
                </kbd>
              ) : (
                <span className="w-6 text-center text-xs text-ink-500" title="No key: use the menu (Enter)">
                  –
                </span>
              )}
              <button
                type="button"
                aria-expanded={openGuideline === t.name}
                onClick={() => onGuideline(openGuideline === t.name ? null : t.name)}
                className={cn("rounded px-1 text-xs text-ink-500 hover:bg-ink-50", openGuideline === t.name && "bg-ink-50 text-ink-900")}
              >
                Guide
              </button>
            </div>
            {openGuideline === t.name ? (
              <div className="mx-1 mb-2 rounded-md border-l-4 bg-paper px-3 py-2" style={{ borderColor: t.color }} data-testid="guideline">
                <GuidelineText source={t.guideline} />
              </div>
            ) : null}
          </li>
        ))}
      </ul>
    </section>
  );
}
