import { randomBytes } from "node:crypto";
import { type MailCatcher, startMailCatcher } from "@tagloom/fakes";
import pg from "pg";
import { afterAll, inject } from "vitest";

// Each test file gets its own database, copied from the migrated template, and its own mail
// catcher, before any app module is imported (config/env.ts reads the environment once).
const adminUrl = inject("pgAdminUrl");
const dbName = `t_${randomBytes(6).toString("hex")}`;
const client = new pg.Client({ connectionString: adminUrl });
await client.connect();
await client.query(`CREATE DATABASE ${dbName} TEMPLATE ${inject("pgTemplate")}`);
await client.end();

const url = new URL(adminUrl);
url.pathname = `/${dbName}`;
process.env.DATABASE_URL = url.toString();
process.env.NODE_ENV = "test";
process.env.LOG_LEVEL ??= "silent";

const catcher = await startMailCatcher();
process.env.SMTP_PORT = String(catcher.smtpPort);
process.env.MAIL_CATCHER_URL = catcher.httpUrl;
(globalThis as { __tagloomMail?: MailCatcher }).__tagloomMail = catcher;

afterAll(async () => {
  // Close what the file opened so the fork can exit; the cluster is removed by the global setup.
  const { stopTestWorkers } = await import("./workers");
  await stopTestWorkers();
  const { stopJobSender } = await import("@/jobs/boss");
  await stopJobSender();
  const { db } = await import("@/db/knex");
  const { pgPool } = await import("@/db/pg-pool");
  await db.destroy();
  await pgPool.end();
  await catcher.stop();
});
