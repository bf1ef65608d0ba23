import type { AssignmentCounts } from "@tagloom/contracts";

/** Assignments by state as one stacked bar: accepted, submitted, in progress or sent back, not started. */
export function ProgressBar({ counts, label }: { counts: AssignmentCounts; label: string }) {
  const total = Math.max(1, counts.total);
  const parts = [
    { n: counts.accepted, cls: "bg-moss-500", name: "accepted" },
    { n: counts.submitted, cls: "bg-ink-500", name: "submitted" },
    { n: counts.in_progress + counts.returned, cls: "bg-thread-500", name: "in progress or sent back" },
  ];
  const done = counts.accepted + counts.submitted;
  const summary = `${label}: ${done} of ${counts.total} finished (${counts.accepted} accepted, ${counts.submitted} submitted, ${counts.in_progress + counts.returned} in progress or sent back, ${counts.open} not started)`;
  return (
    <div className="flex items-center gap-2" title={summary}>
      <div role="img" aria-label={summary} className="flex h-2.5 w-40 overflow-hidden rounded-full bg-ink-100">
        {parts.map((p) => (p.n ? <div key={p.name} className={p.cls} style={{ width: `${(100 * p.n) / total}%` }} /> : null))}
      </div>
      <span className="text-xs text-ink-500 tabular-nums">
        {done}/{counts.total}
      </span>
    </div>
  );
}
