import type { ReactNode } from "react";
import { Link } from "react-router";
import { Card } from "@/components/ui/card";

/** One block of the overview: a heading, its figures and a link to the screen where the work is. */
export function OverviewSection({ title, link, children }: { title: string; link?: { to: string; text: string }; children: ReactNode }) {
  const id = `overview-${title.toLowerCase().replace(/[^a-z]+/g, "-")}`;
  return (
    <Card className="min-w-0 space-y-3" role="region" aria-labelledby={id}>
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id={id} className="font-semibold text-ink-900">
          {title}
        </h2>
        {link ? (
          <Link to={link.to} className="text-sm text-ink-700 underline">
            {link.text}
          </Link>
        ) : null}
      </div>
      {children}
    </Card>
  );
}

/** A progress bar with its numbers in words beside it, so the bar is not the only cue. */
export function ProgressLine({ done, total, label }: { done: number; total: number; label: string }) {
  const pct = total ? Math.round((done / total) * 100) : 0;
  return (
    <div className="flex items-center gap-3">
      <div className="h-2 min-w-16 flex-1 overflow-hidden rounded-full bg-ink-50" role="progressbar" aria-label={label} aria-valuenow={pct} aria-valuemin={0} aria-valuemax={100}>
        <div className="h-full rounded-full bg-thread-500" style={{ width: `${pct}%` }} />
      </div>
      <span className="shrink-0 text-xs text-ink-500 tabular-nums">
        {done} of {total}
      </span>
    </div>
  );
}
