import type { Span } from "@tagloom/contracts";
import { type Snapshot, type WorkSpan, spanKey } from "./annotation-store";

/** A span of mine that could not be re-applied because the newer version has spans where it goes. */
export type Conflict = { mine: WorkSpan; theirs: WorkSpan[] };

export type Rebased = { merged: Snapshot; conflicts: Conflict[]; reapplied: number };

const overlaps = (a: { start: number; end: number }, b: { start: number; end: number }) => a.start < b.end && b.start < a.end;

/**
 * Re-applies my unsaved work onto a newer saved version. My changes are what differs between the
 * version I started from (`base`) and my working copy (`mine`): spans I added are added to
 * theirs unless they would overlap one of theirs (a conflict, reported, never dropped silently);
 * spans I removed are removed from theirs if still there; suggestions I dismissed stay dismissed.
 */
export function rebase(base: Snapshot, mine: Snapshot, theirs: Snapshot): Rebased {
  const baseKeys = new Set(base.spans.map(spanKey));
  const mineKeys = new Set(mine.spans.map(spanKey));
  const added = mine.spans.filter((s) => !baseKeys.has(spanKey(s)));
  const removed = new Set(base.spans.filter((s) => !mineKeys.has(spanKey(s))).map(spanKey));
  const theirKeys = new Set(theirs.spans.map(spanKey));
  let spans: WorkSpan[] = theirs.spans.filter((s) => !removed.has(spanKey(s)));
  let reapplied = theirs.spans.length - spans.length;
  const conflicts: Conflict[] = [];
  for (const a of added) {
    if (theirKeys.has(spanKey(a))) continue;
    const clash = spans.filter((s) => overlaps(s, a));
    if (clash.length) conflicts.push({ mine: a, theirs: clash });
    else {
      spans.push(a);
      reapplied++;
    }
  }
  spans = spans.sort((x, y) => x.start - y.start || x.end - y.end);
  const dismissedKeys = new Set(theirs.dismissed.map(spanKey));
  const dismissed: Span[] = [...theirs.dismissed];
  const baseDismissed = new Set(base.dismissed.map(spanKey));
  for (const d of mine.dismissed) {
    if (!baseDismissed.has(spanKey(d)) && !dismissedKeys.has(spanKey(d))) {
      dismissed.push(d);
      dismissedKeys.add(spanKey(d));
      reapplied++;
    }
  }
  return { merged: { spans, dismissed }, conflicts, reapplied };
}

/** Puts my conflicting span in place of the spans of theirs it overlaps. */
export function preferMine(current: Snapshot, conflict: Conflict): Snapshot {
  const drop = new Set(conflict.theirs.map(spanKey));
  const spans = current.spans.filter((s) => !drop.has(spanKey(s)) && !overlaps(s, conflict.mine));
  return { spans: [...spans, conflict.mine].sort((x, y) => x.start - y.start || x.end - y.end), dismissed: current.dismissed };
}
