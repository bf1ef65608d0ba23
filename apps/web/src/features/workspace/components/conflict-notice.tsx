import { Button } from "@/components/ui/button";
import { useConflict } from "../hooks/use-store";
import type { AnnotationStore } from "../lib/annotation-store";
import type { Autosaver } from "../lib/autosaver";
import { preferMine } from "../lib/rebase";

/**
 * Shown after a save found a newer version on the server (another tab or device): the newer
 * version is loaded, the unsaved changes are re-applied, and those that clash are listed here to
 * keep or drop, one by one.
 */
export function ConflictNotice({ store, saver }: { store: AnnotationStore; saver: Autosaver | null }) {
  const conflict = useConflict(saver);
  if (!conflict || !saver) return null;
  const text = (s: { start: number; end: number }) => store.doc.text.slice(s.start, s.end);
  return (
    <div role="alert" className="rounded-md border border-thread-300 bg-thread-100 px-4 py-3 text-sm text-ink-900">
      <p className="font-medium">These spans were changed elsewhere (another tab or device) while you worked.</p>
      <p className="mt-1">
        The newer version {conflict.version} is loaded.{" "}
        {conflict.reapplied ? `${conflict.reapplied} of your unsaved change${conflict.reapplied === 1 ? " was" : "s were"} re-applied on top of it.` : "You had no unsaved changes to re-apply."}
        {conflict.conflicts.length ? ` ${conflict.conflicts.length} of your changes clash with it:` : ""}
      </p>
      {conflict.conflicts.length ? (
        <ul className="mt-2 space-y-1">
          {conflict.conflicts.map((c) => (
            <li key={`${c.mine.start}:${c.mine.end}:${c.mine.type}`} className="flex flex-wrap items-center gap-2">
              <span>
                Yours: <strong>{c.mine.type}</strong> "{text(c.mine)}" — theirs: {c.theirs.map((t) => `${t.type} "${text(t)}"`).join(", ")}
              </span>
              <Button
                size="sm"
                variant="secondary"
                onClick={() => {
                  store.commitSnapshot(preferMine(store.snapshot, c));
                  saver.dismissConflict();
                }}
              >
                Use mine
              </Button>
            </li>
          ))}
        </ul>
      ) : null}
      <Button size="sm" variant="ghost" className="mt-2" onClick={() => saver.dismissConflict()}>
        {conflict.conflicts.length ? "Keep theirs" : "Got it"}
      </Button>
    </div>
  );
}
