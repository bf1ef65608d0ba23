import type { AssignmentState } from "@tagloom/contracts";
import { useEffect, useState } from "react";
import { cn } from "@/lib/cn";
import { formatTime } from "@/lib/dates";
import { useSaveStatus } from "../hooks/use-store";
import type { Autosaver } from "../lib/autosaver";

type Props = {
  /** The autosaver while the work can change; null for a read-only view. */
  saver: Autosaver | null;
  state: AssignmentState;
  /** When the spans were last saved before this page opened (null when never). */
  savedBefore: string | null;
};

/**
 * What is true about the work right now: submitted or accepted; saved and when; waiting, saving,
 * offline and retrying; or not saved and why. After a reload it says when the work was last
 * saved rather than claiming there is nothing.
 */
export function SaveStatusBadge({ saver, state, savedBefore }: Props) {
  const status = useSaveStatus(saver);
  const [, tick] = useState(0);
  useEffect(() => {
    if (status.kind !== "retrying") return;
    const id = setInterval(() => tick((n) => n + 1), 1000);
    return () => clearInterval(id);
  }, [status.kind]);
  let text: string;
  let tone: "ok" | "busy" | "bad" | "idle";
  if (state === "submitted" || state === "accepted") {
    text = state === "submitted" ? "Submitted" : "Accepted as gold";
    tone = "ok";
  } else if (!saver) {
    text = "Read-only view";
    tone = "idle";
  } else {
    switch (status.kind) {
      case "saved":
        if (status.at) text = `Saved ${formatTime(new Date(status.at))}`;
        else text = savedBefore ? `Saved ${formatTime(savedBefore)}` : "Nothing to save yet";
        tone = status.at || savedBefore ? "ok" : "idle";
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
  }
  return (
    <div role="status" aria-live="polite" className="flex items-center gap-2 text-sm" data-save-state={state === "submitted" || state === "accepted" ? state : status.kind} data-saved-at={status.kind === "saved" && status.at ? status.at : undefined}>
      <span aria-hidden className={cn("size-2.5 rounded-full", tone === "ok" && "bg-moss-500", tone === "busy" && "bg-thread-500", tone === "bad" && "bg-rust-500", tone === "idle" && "bg-ink-200")} />
      <span className={cn(tone === "bad" ? "font-medium text-rust-500" : "text-ink-500")}>{text}</span>
      {saver && (status.kind === "retrying" || status.kind === "failed") ? (
        <button type="button" className="rounded border border-ink-200 px-2 py-0.5 text-xs text-ink-800 hover:bg-ink-50" onClick={() => saver.retry()}>
          Retry now
        </button>
      ) : null}
    </div>
  );
}
