import type { FileState } from "@tagloom/contracts";
import { cn } from "@/lib/cn";

const styles: Record<FileState, string> = {
  queued: "bg-ink-50 text-ink-500",
  processing: "bg-thread-100 text-thread-700",
  ready: "bg-moss-500/10 text-moss-500",
  failed: "bg-rust-500/10 text-rust-500",
};
const labels: Record<FileState, string> = { queued: "Queued", processing: "Processing", ready: "Ready", failed: "Failed" };

/** A file's state as a small coloured label. */
export function FileStateBadge({ state }: { state: FileState }) {
  return <span className={cn("inline-flex rounded px-1.5 py-0.5 text-xs font-medium whitespace-nowrap", styles[state])}>{labels[state]}</span>;
}
