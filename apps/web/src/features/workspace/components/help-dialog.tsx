import { useEffect, useRef } from "react";
import { GuidelineText } from "@/components/markdown/guideline-text";
import { Button } from "@/components/ui/button";
import type { AnnotationStore } from "../lib/annotation-store";
import { KEY_HELP } from "../lib/keymap";

/** All keys and every type's guideline, over the text (the ? key). */
export function HelpDialog({ store, onClose }: { store: AnnotationStore; onClose: () => void }) {
  const ref = useRef<HTMLDivElement>(null);
  useEffect(() => ref.current?.focus(), []);
  return (
    <div className="fixed inset-0 z-40 flex items-start justify-center bg-ink-900/30 p-2 sm:p-8" onPointerDown={(e) => e.target === e.currentTarget && onClose()}>
      <div
        ref={ref}
        role="dialog"
        aria-modal="true"
        aria-labelledby="help-title"
        tabIndex={-1}
        onKeyDown={(e) => {
          if (e.key === "Escape" || e.key === "?") {
            e.preventDefault();
            onClose();
          }
        }}
        className="max-h-full w-full max-w-2xl overflow-y-auto rounded-lg bg-white p-4 shadow-xl focus:outline-none sm:p-6"
      >
        <div className="flex items-center justify-between">
          <h2 id="help-title" className="text-lg font-semibold">
            Keys and guidelines
          </h2>
          <Button variant="ghost" size="sm" onClick={onClose}>
            Close (Esc)
          </Button>
        </div>
        <dl className="mt-4 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1.5 text-sm">
          {KEY_HELP.map(([k, what]) => (
            <div key={k} className="contents">
              <dt>
                <kbd className="font-mono text-ink-800">{k}</kbd>
              </dt>
              <dd className="text-ink-700">{what}</dd>
            </div>
          ))}
        </dl>
        <h3 className="mt-6 font-semibold">Guidelines</h3>
        <div className="mt-2 space-y-3">
          {store.types.map((t) => (
            <div key={t.id} className="rounded-md border-l-4 bg-paper px-3 py-2" style={{ borderColor: t.color }}>
              <p className="text-sm font-semibold">
                {t.name} {t.hotkey ? <kbd className="ml-1 font-mono text-xs text-ink-500">{t.hotkey}</kbd> : null}
              </p>
              <div className="mt-1">
                <GuidelineText source={t.guideline} />
              </div>
            </div>
          ))}
        </div>
      </div>
    </div>
  );
}
