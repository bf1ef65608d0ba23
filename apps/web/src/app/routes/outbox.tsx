import { useState } from "react";
import { Link } from "react-router";
import { Brand } from "@/components/layout/brand";
import { EmptyState, Notice, PageHeader, Skeleton } from "@/components/ui/card";
import { useAppMeta, useOutbox } from "@/features/outbox/api/outbox";
import { cn } from "@/lib/cn";
import { NotFoundRoute } from "./not-found";
import { formatTime } from "@/lib/dates";

/** Development only: the e-mails the local mail catcher received, newest first. */
export function OutboxRoute() {
  const meta = useAppMeta();
  const enabled = meta.data?.outbox === true;
  const outbox = useOutbox(enabled);
  const [openId, setOpenId] = useState<string | null>(null);
  if (meta.isPending) return <Skeleton />;
  if (!enabled) return <NotFoundRoute />;
  const items = outbox.data?.items ?? [];
  const open = items.find((m) => m.id === openId) ?? items[0];
  return (
    <div className="min-h-full px-6 py-6">
      <div className="mb-6 flex items-center justify-between">
        <Brand />
        <Link to="/" className="text-sm text-ink-500 hover:underline">
          Back to Tagloom
        </Link>
      </div>
      <PageHeader title="Outbox" subtitle="Development only: every e-mail the local mail catcher received. Not available in production." />
      {outbox.isPending ? (
        <Skeleton shape="table" />
      ) : outbox.isError ? (
        <Notice tone="error">{outbox.error.message}</Notice>
      ) : items.length === 0 ? (
        <EmptyState title="No e-mail yet" />
      ) : (
        <div className="grid gap-4 lg:grid-cols-[22rem_1fr]">
          <ul className="divide-y divide-ink-50 overflow-hidden rounded-lg border border-ink-100 bg-white">
            {items.map((m) => (
              <li key={m.id}>
                <button
                  type="button"
                  onClick={() => setOpenId(m.id)}
                  className={cn("block w-full px-4 py-3 text-left hover:bg-ink-50", open?.id === m.id && "bg-ink-50")}
                >
                  <span className="block truncate text-sm font-medium text-ink-900">{m.subject}</span>
                  <span className="block truncate text-xs text-ink-500">
                    to {m.to.join(", ")} · {formatTime(m.receivedAt)}
                  </span>
                </button>
              </li>
            ))}
          </ul>
          {open ? (
            <article className="rounded-lg border border-ink-100 bg-white p-5" aria-label="Message">
              <h2 className="text-lg font-semibold">{open.subject}</h2>
              <p className="mb-4 text-xs text-ink-500">
                From {open.from} to {open.to.join(", ")}
              </p>
              <pre className="font-sans text-sm whitespace-pre-wrap text-ink-800">{linkify(open.text)}</pre>
            </article>
          ) : null}
        </div>
      )}
    </div>
  );
}

/** Plain-text body with its links clickable (the HTML body is not rendered here on purpose). */
function linkify(text: string) {
  return text.split(/(https?:\/\/\S+)/g).map((part, i) =>
    /^https?:\/\//.test(part) ? (
      <a key={i} href={part} className="break-all text-ink-500 underline">
        {part}
      </a>
    ) : (
      part
    ),
  );
}
