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

export function Spinner({ label = "Loading" }: { label?: string }) {
  return (
    <div role="status" className="flex items-center gap-2 text-sm text-ink-500">
      <span className="size-4 animate-spin rounded-full border-2 border-ink-300 border-t-transparent" aria-hidden />
      {label}…
    </div>
  );
}
