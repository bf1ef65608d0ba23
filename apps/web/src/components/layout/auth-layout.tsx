import type { ReactNode } from "react";
import { Brand } from "./brand";

/** The frame of the signed-out screens: the mark, a card, a line about the product. */
export function AuthLayout({ title, subtitle, children }: { title: string; subtitle?: ReactNode; children: ReactNode }) {
  return (
    <div className="flex min-h-full flex-col items-center justify-center bg-gradient-to-b from-ink-50 to-paper px-4 py-12">
      <div className="mb-8">
        <Brand />
      </div>
      <main className="w-full max-w-md rounded-xl border border-ink-100 bg-white p-8 shadow-sm">
        <h1 className="text-xl font-semibold text-ink-900">{title}</h1>
        {subtitle ? <div className="mt-1 text-sm text-ink-500">{subtitle}</div> : null}
        <div className="mt-6">{children}</div>
      </main>
      <p className="mt-8 max-w-md text-center text-xs text-ink-500">
        Tagloom turns your team's documents into named-entity data and taggers you can measure.
      </p>
    </div>
  );
}
