import { useEffect, useState } from "react";
import { cn } from "@/lib/cn";
import { useSaveStatus } from "../hooks/use-store";
import type { Autosaver } from "../lib/autosaver";

/** Where the work stands: saved, waiting, saving, offline and retrying, or not saved and why. */
export function SaveStatusBadge({ saver }: { saver: Autosaver | null }) {
  const status = useSaveStatus(saver);
  const [, tick] = useState(0);
  useEffect(() => {
    if (status.kind !== "retrying") return;
    const id = setInterval(() => tick((n) => n + 1), 1000);
    return () => clearInterval(id);
  }, [status.kind]);
  let text: string;
  let tone: "ok" | "busy" | "bad";
  switch (status.kind) {
    case "saved":
      text = status.at ? "All changes saved" : "No changes yet";
      tone = "ok";
      break;
    case "unsaved":
      text = "Unsaved changes…";
      tone = "busy";
      break;
    case "saving":
      text = "Saving…";
      tone = "busy";
      break;
    case "retrying":
      text = `${status.reason} Not saved yet; trying again in ${Math.max(0, Math.ceil((status.retryAt - Date.now()) / 1000))} s.`;
      tone = "bad";
      break;
    case "failed":
      text = `Not saved: ${status.reason}`;
      tone = "bad";
      break;
    case "locked":
      text = status.reason;
      tone = "bad";
  }
  return (
    <div role="status" aria-live="polite" className="flex items-center gap-2 text-sm" data-save-state={status.kind}>
      <span aria-hidden className={cn("size-2.5 rounded-full", tone === "ok" && "bg-moss-500", tone === "busy" && "bg-thread-500", tone === "bad" && "bg-rust-500")} />
      <span className={cn(tone === "bad" ? "font-medium text-rust-500" : "text-ink-500")}>{text}</span>
      {status.kind === "retrying" || status.kind === "failed" ? (
        <button type="button" className="rounded border border-ink-200 px-2 py-0.5 text-xs text-ink-800 hover:bg-ink-50" onClick={() => saver?.retry()}>
          Retry now
        </button>
      ) : null}
    </div>
  );
}
