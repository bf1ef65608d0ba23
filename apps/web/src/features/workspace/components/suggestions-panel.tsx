import { useMemo, useState, useSyncExternalStore } from "react";
import { Button } from "@/components/ui/button";
import type { AnnotationStore } from "../lib/annotation-store";
import { tokenRange } from "../lib/doc-index";

/**
 * Suggestions not yet decided, each with its confidence: accept or reject one, or all at or
 * above a confidence. Suggestions are proposals from an import or a tagger, not answers.
 */
export function SuggestionsPanel({ store, onJump }: { store: AnnotationStore; onJump: () => void }) {
  // Re-renders only when the undecided suggestions change, not on every edit.
  const pending = useSyncExternalStore(store.subscribe, () => store.pendingSuggestions);
  const readOnly = useSyncExternalStore(store.subscribe, () => store.readOnly);
  const [percent, setPercent] = useState(80);
  const threshold = percent / 100;
  const [above, below] = useMemo(() => [pending.filter((s) => s.confidence >= threshold), pending.filter((s) => s.confidence < threshold)], [pending, threshold]);
  if (!store.suggestions.length) return null;
  return (
    <section aria-labelledby="suggestions-title" className="rounded-lg border border-dashed border-ink-200 bg-white p-3">
      <h2 id="suggestions-title" className="px-1 text-xs font-semibold tracking-wide text-ink-500 uppercase">
        Suggestions <span className="font-normal normal-case">({pending.length} to decide)</span>
      </h2>
      <p className="mt-1 px-1 text-xs text-ink-500">Proposals, not answers: dashed in the text with their confidence. Check each one.</p>
      {pending.length ? (
        <>
          <div className="mt-3 flex items-center gap-2 px-1 text-sm">
            <label htmlFor="suggestion-threshold" className="text-ink-700">
              Confidence at least
            </label>
            <input
              id="suggestion-threshold"
              type="number"
              min={0}
              max={100}
              step={5}
              value={percent}
              onChange={(e) => setPercent(Math.max(0, Math.min(100, Number(e.target.value) || 0)))}
              className="w-16 rounded-md border border-ink-200 px-2 py-1 text-sm"
            />
            %
          </div>
          <div className="mt-2 flex flex-wrap gap-2 px-1">
            <Button size="sm" variant="secondary" disabled={!above.length || readOnly} onClick={() => store.acceptSuggestions(above)}>
              Accept {above.length} at or above
            </Button>
            <Button size="sm" variant="ghost" disabled={!below.length || readOnly} onClick={() => store.rejectSuggestions(below)}>
              Reject {below.length} below
            </Button>
          </div>
          <ul className="mt-3 max-h-56 space-y-1 overflow-y-auto">
            {pending.slice(0, 100).map((s) => (
              <li key={`${s.start}:${s.end}:${s.type}`} className="flex items-center gap-2 rounded-md px-1 text-sm hover:bg-ink-50">
                <button
                  type="button"
                  className="min-w-0 flex-1 truncate text-left text-ink-800"
                  onClick={() => {
                    store.moveCursor(tokenRange(store.doc, s)[0]);
                    onJump();
                  }}
                >
                  <span className="font-medium">{store.doc.text.slice(s.start, s.end)}</span>{" "}
                  <span className="text-xs text-ink-500">
                    {s.type} · {Math.round(s.confidence * 100)}%
                  </span>
                </button>
                <button type="button" disabled={readOnly} className="rounded px-1 text-xs text-moss-500 hover:underline disabled:opacity-40" onClick={() => store.acceptSuggestions([s])}>
                  Accept
                </button>
                <button type="button" disabled={readOnly} className="rounded px-1 text-xs text-rust-500 hover:underline disabled:opacity-40" onClick={() => store.rejectSuggestions([s])}>
                  Reject
                </button>
              </li>
            ))}
          </ul>
        </>
      ) : (
        <p className="mt-2 px-1 text-sm text-ink-500">All suggestions decided.</p>
      )}
    </section>
  );
}
