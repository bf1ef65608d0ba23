import fs from "node:fs";
import autocannon from "autocannon";

/** Answers of one scenario: every latency (ms), counts by HTTP status, and connection faults. */
export class Recorder {
  readonly latencies: number[] = [];
  /** When each answer came (ms since the recorder was made), beside its latency. */
  readonly times: number[] = [];
  private readonly origin = performance.now();
  readonly statuses = new Map<number, number>();
  /** autocannon's count: connection errors and timeouts together. */
  errors = 0;
  timeouts = 0;

  constructor(readonly name: string) {}

  /** Counts every answer of an autocannon instance and its faults once it is done. */
  watch(instance: autocannon.Instance): Promise<void> {
    instance.on("response", (_client: unknown, status: number, _bytes: number, ms: number) => {
      this.latencies.push(ms);
      this.times.push(performance.now() - this.origin);
      this.statuses.set(status, (this.statuses.get(status) ?? 0) + 1);
    });
    return new Promise<autocannon.Result>((resolve, reject) => {
      instance.on("done", resolve);
      instance.on("error", reject);
    }).then((r) => {
      this.errors += r.errors;
      this.timeouts += r.timeouts;
    });
  }

  /** Nearest-rank percentile (common practice: the smallest value with at least p% of the values at or below it). */
  percentile(p: number, values: readonly number[] = this.latencies): number {
    const sorted = [...values].sort((a, b) => a - b);
    if (!sorted.length) return NaN;
    return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1))]!;
  }

  /** p95 of the answers in each window of `windowSeconds` (to tell a slow start from a slow run). */
  windowedP95(windowSeconds: number): string {
    const buckets: number[][] = [];
    this.times.forEach((t, i) => (buckets[Math.floor(t / 1000 / windowSeconds)] ??= []).push(this.latencies[i]!));
    return [...buckets].map((b) => (b ? this.percentile(95, b).toFixed(0) : "-")).join(", ");
  }

  count(pred: (status: number) => boolean): number {
    let n = 0;
    for (const [s, c] of this.statuses) if (pred(s)) n += c;
    return n;
  }

  /** `offered`: requests a second the scenario would send if every answer came at once (0: unpaced). */
  summary(seconds: number, offered = 0): string {
    const total = this.latencies.length;
    const byStatus = [...this.statuses.entries()].sort(([a], [b]) => a - b).map(([s, c]) => `${s}: ${c}`).join(", ");
    const notOk = [...this.statuses.entries()].filter(([s]) => s >= 300).sort(([a], [b]) => a - b).map(([s, c]) => `${s}: ${c}`).join(", ");
    const f = (x: number) => x.toFixed(1);
    return [
      `${this.name}: ${total} requests, ${(total / seconds).toFixed(1)} requests/s${offered > 0 ? ` (paced at most ${offered}/s)` : " (unpaced)"}`,
      `  latency ms: p50 ${f(this.percentile(50))}, p95 ${f(this.percentile(95))}, p99 ${f(this.percentile(99))}, max ${f(this.percentile(100))}`,
      `  p95 ms per 10 s window: ${this.windowedP95(10)}`,
      `  answers by status: ${byStatus || "none"}`,
      `  errors by status: ${notOk || "none"}; connection errors: ${this.errors - this.timeouts}, timeouts: ${this.timeouts}`,
    ].join("\n");
  }
}

/**
 * CPU time (user + system, seconds) a process has used, from /proc/<pid>/stat (Linux; 100 clock
 * ticks a second, the kernel's USER_HZ). With `reapedChildren`, the time of its children that
 * have exited and been waited for is added (fields 16 and 17: how a server's ended backends count).
 */
export function cpuSeconds(pid: number, reapedChildren = false): number {
  try {
    const stat = fs.readFileSync(`/proc/${pid}/stat`, "utf8");
    // The fields after the command name (which may hold spaces) start at state, field 3; utime and stime are fields 14 and 15.
    const fields = stat.slice(stat.lastIndexOf(")") + 2).split(" ");
    const own = Number(fields[11]) + Number(fields[12]);
    return (reapedChildren ? own + Number(fields[13]) + Number(fields[14]) : own) / 100;
  } catch {
    return NaN;
  }
}
