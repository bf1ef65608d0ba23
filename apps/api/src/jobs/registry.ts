import type PgBoss from "pg-boss";
import { ensureQueue } from "@/jobs/boss";
import { logger } from "@/logger";

/** A job handler of a feature: the queue it serves and what it does with one job's data. */
export type JobDefinition = {
  queue: string;
  /** How many jobs one worker process runs at once on this queue. */
  concurrency?: number;
  /** A cron expression when the job also runs on a schedule (worker processes only). */
  schedule?: string;
  handle: (data: unknown, job: { id: string; retryCount?: number }) => Promise<void>;
};

const definitions: JobDefinition[] = [];

/** Features register their jobs here (imported by worker.ts through jobs/all-jobs.ts). */
export function defineJob(def: JobDefinition): JobDefinition {
  definitions.push(def);
  return def;
}

export function registeredJobs(): readonly JobDefinition[] {
  return definitions;
}

/** Starts polling every registered queue on a worker-side pg-boss. */
export async function startJobWorkers(boss: PgBoss, pollingIntervalSeconds = 0.5): Promise<void> {
  for (const def of definitions) {
    await ensureQueue(boss, def.queue);
    if (def.schedule) await boss.schedule(def.queue, def.schedule);
    const slots = def.concurrency ?? 1;
    for (let i = 0; i < slots; i++) {
      await boss.work(def.queue, { batchSize: 1, pollingIntervalSeconds }, async (jobs) => {
        for (const job of jobs) {
          const started = Date.now();
          try {
            await def.handle(job.data, { id: job.id });
            logger.info({ queue: def.queue, jobId: job.id, ms: Date.now() - started }, "job done");
          } catch (err) {
            logger.warn({ queue: def.queue, jobId: job.id, err }, "job failed; pg-boss will retry it");
            throw err;
          }
        }
      });
    }
  }
}
