import type { HTMLAttributes, ReactNode } from "react";
import { cn } from "@/lib/cn";

export function Card({ className, ...rest }: HTMLAttributes<HTMLDivElement>) {
  return <div className={cn("rounded-lg border border-ink-100 bg-white p-5 shadow-sm", className)} {...rest} />;
}

/** The title row of a screen: heading, a line of context and the screen's main actions. */
export function PageHeader({ title, subtitle, actions }: { title: ReactNode; subtitle?: ReactNode; actions?: ReactNode }) {
  return (
    <div className="mb-6 flex flex-wrap items-end justify-between gap-4">
      <div>
        <h1 className="text-2xl font-semibold tracking-tight text-ink-900">{title}</h1>
        {subtitle ? <p className="mt-1 text-sm text-ink-500">{subtitle}</p> : null}
      </div>
      {actions ? <div className="flex items-center gap-2">{actions}</div> : null}
    </div>
  );
}

export function EmptyState({ title, children }: { title: string; children?: ReactNode }) {
  return (
    <div className="rounded-lg border border-dashed border-ink-200 bg-white/60 p-10 text-center">
      <p className="font-medium text-ink-800">{title}</p>
      {children ? <div className="mt-2 text-sm text-ink-500">{children}</div> : null}
    </div>
  );
}

export function Notice({ tone = "info", children, className }: { tone?: "info" | "warn" | "error"; children: ReactNode; className?: string }) {
  const tones = {
    info: "border-ink-100 bg-ink-50 text-ink-800",
    warn: "border-thread-300 bg-thread-100 text-ink-900",
    error: "border-rust-500/40 bg-rust-500/10 text-rust-500",
  };
  return (
    <div role={tone === "error" ? "alert" : "note"} className={cn("rounded-md border px-4 py-3 text-sm", tones[tone], className)}>
      {children}
    </div>
  );
}

/**
 * A placeholder in the shape of what is coming (grey bars where lines and rows will be), instead
 * of a blank page with "Loading…". `table` draws a header and rows; `text` draws paragraph lines.
 */
export function Skeleton({ label = "Loading", shape = "text", rows = 4 }: { label?: string; shape?: "text" | "table"; rows?: number }) {
  const widths = [92, 78, 85, 64, 88, 71];
  return (
    <div role="status" className="w-full animate-pulse motion-reduce:animate-none" data-testid="skeleton">
      <span className="sr-only">{label}…</span>
      {shape === "table" ? (
        <div aria-hidden className="overflow-hidden rounded-lg border border-ink-100 bg-white">
          <div className="h-9 border-b border-ink-100 bg-ink-50/60" />
          {Array.from({ length: rows }, (_, i) => (
            <div key={i} className="flex gap-4 border-b border-ink-50 px-4 py-3 last:border-0">
              <div className="h-3.5 rounded bg-ink-100" style={{ width: `${widths[i % widths.length]! / 2}%` }} />
              <div className="h-3.5 w-1/6 rounded bg-ink-50" />
              <div className="h-3.5 w-1/6 rounded bg-ink-50" />
            </div>
          ))}
        </div>
      ) : (
        <div aria-hidden className="space-y-2.5">
          {Array.from({ length: rows }, (_, i) => (
            <div key={i} className="h-3.5 rounded bg-ink-100" style={{ width: `${widths[i % widths.length]}%` }} />
          ))}
        </div>
      )}
    </div>
  );
}
