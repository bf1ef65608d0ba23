import PgBoss from "pg-boss";
import { env } from "@/config/env";
import { logger } from "@/logger";

let senderPromise: Promise<PgBoss> | null = null;
const createdQueues = new Set<string>();

/**
 * A pg-boss instance for sending jobs from the API process. It neither supervises nor schedules:
 * worker processes do that, so any number of APIs and workers can share one database.
 */
export function getJobSender(): Promise<PgBoss> {
  senderPromise ??= (async () => {
    const boss = new PgBoss({ connectionString: env.DATABASE_URL, supervise: false, schedule: false, max: 4 });
    boss.on("error", (err) => logger.error({ err }, "pg-boss sender error"));
    await boss.start();
    return boss;
  })();
  return senderPromise;
}

/** A pg-boss instance that runs maintenance and cron schedules (worker processes). */
export async function startWorkerBoss(): Promise<PgBoss> {
  const boss = new PgBoss({ connectionString: env.DATABASE_URL, supervise: true, schedule: true, max: 6, maintenanceIntervalSeconds: env.JOB_MAINTENANCE_SECONDS });
  boss.on("error", (err) => logger.error({ err }, "pg-boss worker error"));
  await boss.start();
  return boss;
}

/** Creates a queue once per process (pg-boss 10 drops jobs sent to a queue that does not exist). */
export async function ensureQueue(boss: PgBoss, name: string): Promise<void> {
  if (createdQueues.has(name)) return;
  await boss.createQueue(name, { name, retryLimit: 5, retryDelay: 2, retryBackoff: true, expireInSeconds: 15 * 60 });
  createdQueues.add(name);
}

/** Sends a job, creating its queue on first use. Returns the job id. */
export async function enqueueJob(name: string, data: object, options: PgBoss.SendOptions = {}): Promise<string | null> {
  const boss = await getJobSender();
  await ensureQueue(boss, name);
  return boss.send(name, data, options);
}

/** Stops the sender if one was started (server shutdown, tests). */
export async function stopJobSender(): Promise<void> {
  if (!senderPromise) return;
  const boss = await senderPromise;
  senderPromise = null;
  createdQueues.clear();
  await boss.stop({ graceful: true, wait: true, timeout: 5000 });
}
