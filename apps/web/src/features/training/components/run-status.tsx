import { runStageLabels, runStatusStates, type TrainingRun } from "@tagloom/contracts";
import { StateBadge } from "@/components/ui/state-badge";

/** A run's state as a badge, with its stage while it trains. */
export function RunStatus({ run }: { run: Pick<TrainingRun, "status" | "stage" | "cancelRequested"> }) {
  return (
    <span className="inline-flex flex-wrap items-center gap-2">
      <StateBadge state={runStatusStates[run.status]} />
      {run.status === "running" && run.stage ? <span className="text-xs text-ink-500">{runStageLabels[run.stage]}</span> : null}
      {run.cancelRequested && run.status === "running" ? <span className="text-xs text-rust-500">cancelling…</span> : null}
    </span>
  );
}

/** A fraction in [0, 1] as a percentage with one decimal (e.g. 0.8125 → "81.3 %"). */
export function pct(x: number): string {
  return `${(x * 100).toFixed(1)} %`;
}

/** A score in [0, 1] with three decimals, the way scoring scripts print F1 (common practice). */
export function score(x: number): string {
  return x.toFixed(3);
}
