import { randomBytes } from "node:crypto";
import { type MailCatcher, type PaymentsFake, startMailCatcher, startPaymentsFake } from "@tagloom/fakes";
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

// The payments fake of this file; billing tests point its webhooks at their server.
const payments = await startPaymentsFake();
process.env.STRIPE_API_PORT = String(payments.port);
(globalThis as { __tagloomPayments?: PaymentsFake }).__tagloomPayments = payments;
// Seats are not what other features test: a roomy free plan unless a file asks for fewer
// (billing tests set BILLING_FREE_SEATS in vi.hoisted before the app is imported).
process.env.BILLING_FREE_SEATS ??= "50";

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
  await payments.stop();
});
