import type { StateInfo, StateTone } from "@tagloom/contracts";
import { cn } from "@/lib/cn";

const tones: Record<StateTone, string> = {
  idle: "bg-ink-50 text-ink-700 ring-ink-200",
  active: "bg-thread-100 text-thread-700 ring-thread-300",
  waiting: "bg-white text-ink-800 ring-ink-300",
  done: "bg-moss-500/10 text-[#3b6b45] ring-moss-500/40",
  problem: "bg-rust-500/10 text-rust-500 ring-rust-500/40",
};
const marks: Record<StateTone, string> = { idle: "○", active: "◐", waiting: "◔", done: "●", problem: "!" };

/**
 * A state as a badge: its one label from the contracts' state tables (never a local copy), a tone
 * and a small mark so the tone is not carried by colour alone.
 */
export function StateBadge({ state, prefix, className }: { state: StateInfo; prefix?: string; className?: string }) {
  return (
    <span title={state.hint} className={cn("inline-flex items-center gap-1 rounded-full px-2 py-0.5 text-xs font-medium whitespace-nowrap ring-1 ring-inset", tones[state.tone], className)}>
      <span aria-hidden className="text-[10px] leading-none">
        {marks[state.tone]}
      </span>
      <span>
        {prefix ? `${prefix}: ` : null}
        {state.label}
      </span>
    </span>
  );
}
