import type { ChildProcess } from "node:child_process";
import type PgBoss from "pg-boss";
import { spawnApiEntry } from "./server-process";

let boss: PgBoss | null = null;

/** Runs the job workers inside the test process (as a worker process would), once per file. */
export async function startTestWorkers(): Promise<void> {
  if (boss) return;
  await import("@/jobs/all-jobs");
  const { startWorkerBoss } = await import("@/jobs/boss");
  const { startJobWorkers } = await import("@/jobs/registry");
  boss = await startWorkerBoss();
  await startJobWorkers(boss, 0.5);
}

export async function stopTestWorkers(): Promise<void> {
  if (!boss) return;
  const b = boss;
  boss = null;
  await b.stop({ graceful: false, wait: true, timeout: 5000 });
}

/**
 * A worker as a process of its own (src/worker.ts), with pg-boss maintenance every second so that
 * a dead worker's expired job is handed on within a test. Stop it with stopProcess, or kill it.
 */
export function startWorkerProcess(env: Record<string, string> = {}): ChildProcess {
  return spawnApiEntry("src/worker.ts", { JOB_MAINTENANCE_SECONDS: "1", LOG_LEVEL: "silent", ...env });
}
