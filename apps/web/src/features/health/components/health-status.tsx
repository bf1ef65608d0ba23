import { cn } from "@/lib/cn";
import { useHealth } from "../api/get-health";

/** A small line in the footer saying whether the service and its database answer. */
export function HealthStatus() {
  const { data, isPending, isError } = useHealth();
  const state = isPending ? "checking" : isError ? "unreachable" : data?.ok ? "ok" : "db-down";
  const text = {
    checking: "Checking service…",
    unreachable: "Service unreachable",
    ok: "Service and database up",
    "db-down": "Database down",
  }[state];
  return (
    <span className="inline-flex items-center gap-2 text-xs text-ink-500" data-state={state}>
      <span
        aria-hidden
        className={cn(
          "size-2 rounded-full",
          state === "ok" && "bg-moss-500",
          state === "checking" && "bg-ink-300",
          (state === "unreachable" || state === "db-down") && "bg-rust-500",
        )}
      />
      {text}
    </span>
  );
}
