import "@/jobs/all-jobs";
import { db } from "@/db/knex";
import { startWorkerBoss } from "@/jobs/boss";
import { registeredJobs, startJobWorkers } from "@/jobs/registry";
import { logger } from "@/logger";

// A worker process: any number of them may run, on any machine, against the same database.
const boss = await startWorkerBoss();
await startJobWorkers(boss);
logger.info({ queues: registeredJobs().map((j) => j.queue) }, "worker started");

async function shutdown(signal: string): Promise<void> {
  logger.info({ signal }, "worker shutting down");
  await boss.stop({ graceful: true, wait: true, timeout: 20_000 }).catch(() => undefined);
  await db.destroy().catch(() => undefined);
  process.exit(0);
}
process.on("SIGTERM", () => void shutdown("SIGTERM"));
process.on("SIGINT", () => void shutdown("SIGINT"));
