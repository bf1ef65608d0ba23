import type PgBoss from "pg-boss";

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
