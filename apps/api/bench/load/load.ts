// Load: 100 annotators autosaving and 10 managers paging the Documents table at the same time,
// against the built product (the API serving the built web app, with a worker process beside it)
// on a throwaway PostgreSQL on 127.0.0.1. Reports requests/s, p50/p95/p99 latency and errors by
// status per scenario, then reads PostgreSQL to check that every save the API acknowledged is
// there ("acknowledged saves lost: N").
//
// Sessions and rate limits. The limits stay at their defaults and are not bypassed (the product's
// environment has no AUTH_RATE_LIMIT or TRUST_PROXY). Sign-in allows 20 attempts per address per
// 15 minutes and every simulated person comes from 127.0.0.1, so 110 sign-ins cannot all go
// through the route: the founder's sign-up and the 10 managers' sign-ins do (11 attempts). The
// annotators are treated as people who signed in earlier, each from their own address, and come
// back with their 30-day session: each gets one from lucia.createSession (the call the sign-in
// route makes), stored in the user_session table, and checked with GET /api/me before the run.
//
// Pace. Each annotator saves LOAD_SAVE_RATE times a second (default 1: the workspace saves at
// most once a second, after a pause of 800 ms, so this is the most a person at the keyboard can
// cause); each manager asks for LOAD_PAGE_RATE pages a second (default 2). A rate of 0 sends as
// fast as the answers come (a saturation run: its latency is then queueing).
//
// Bounded: the run lasts LOAD_SECONDS (default 60) and a watchdog ends everything if setup or the
// check hangs. Not part of `npm test`; `npm run bench` skips it (bench.sh runs apps/api/bench/*.ts,
// and this lives in bench/load/), because a minute of 110 connections is a run of its own.
//
// Run: npm run bench:load   (or LOAD_SECONDS=20 npm run bench:load)
// Other settings: LOAD_ANNOTATORS=100 LOAD_MANAGERS=10 LOAD_DOCUMENTS=5000 (extra documents in the
// corpus, so the table has many pages) LOAD_REUSE_WEB_BUILD=1 (skip the web build when dist exists).
import fs from "node:fs";
import path from "node:path";
import os from "node:os";
import { monitorEventLoopDelay } from "node:perf_hooks";
import { rssMb } from "../support/bench-product";
import { runAnnotators } from "./annotators";
import { apiResponseTimes } from "./api-log";
import { checkAcknowledgedSaves } from "./check-saves";
import { runManagers } from "./managers";
import { createLoadOrg } from "./people";
import { type LoadProduct, startLoadProduct } from "./product";
import { Recorder, cpuSeconds } from "./stats";

function setting(name: string, fallback: number): number {
  const raw = process.env[name];
  const value = raw === undefined || raw === "" ? fallback : Number(raw);
  if (!Number.isFinite(value) || value < 0) throw new Error(`${name} must be a number ≥ 0 (got "${raw}")`);
  return value;
}

const SECONDS = Math.max(1, Math.round(setting("LOAD_SECONDS", 60)));
const ANNOTATORS = Math.max(1, Math.round(setting("LOAD_ANNOTATORS", 100)));
const MANAGERS = Math.max(1, Math.round(setting("LOAD_MANAGERS", 10)));
const SAVE_RATE = setting("LOAD_SAVE_RATE", 1);
const PAGE_RATE = setting("LOAD_PAGE_RATE", 2);
const DOCUMENTS = Math.round(setting("LOAD_DOCUMENTS", 5000));

const loadAverage = () => os.loadavg().map((x) => x.toFixed(2)).join(", ");
const started = Date.now();
const elapsed = () => `${((Date.now() - started) / 1000).toFixed(0)} s`;

let product: LoadProduct | null = null;
// Setup, the run and the check together get at most the run plus 15 minutes.
const watchdog = setTimeout(() => {
  console.error(`load bench: still not done after ${elapsed()}; stopping`);
  void (product?.stop() ?? Promise.resolve()).finally(() => process.exit(2));
}, (SECONDS + 900) * 1000);
watchdog.unref();

console.log(`machine: ${os.cpus().length} cores, Node ${process.version}, load average ${loadAverage()} (1, 5, 15 min)`);
try {
  product = await startLoadProduct();
  console.log(`[${elapsed()}] product up at ${product.base} (built web app served by the API, one worker; log ${product.logFile})`);
  const org = await createLoadOrg(product.base, { annotatorCount: ANNOTATORS, managerCount: MANAGERS, extraDocuments: DOCUMENTS });
  console.log(
    `[${elapsed()}] ${org.annotators.length} annotators (one document of ${org.tokensPerAnnotatorDocument} tokens each, one batch), ` +
      `${org.managers.length} managers, ${org.documentCount} documents in the corpus`,
  );
  console.log(`sessions: ${org.signInsUsed} through sign-up/sign-in from 127.0.0.1 (rate limit header after the last: "${org.signInLimitLeft}"), ${org.annotators.length} opened with lucia.createSession and checked with GET /api/me`);
  const pace = (r: number, what: string) => (r > 0 ? `${r} ${what}/s each` : "as fast as answered");
  console.log(`running ${SECONDS} s: annotators ${pace(SAVE_RATE, "saves")}, managers ${pace(PAGE_RATE, "pages")}; load average before: ${loadAverage()}`);

  const api = product.api.pid!;
  const worker = product.worker.pid!;
  // Backends that end during the run leave their time in the postmaster's count of its reaped children.
  const pgCpu = () => product!.postgresPids().reduce((sum, pid, i) => sum + (cpuSeconds(pid, i === 0) || 0), 0);
  const cpuBefore = { api: cpuSeconds(api), worker: cpuSeconds(worker), pg: pgCpu(), self: process.cpuUsage() };
  // The load generator shares the machine: its own event-loop lag adds to every latency it measures.
  const lag = monitorEventLoopDelay({ resolution: 10 });
  lag.enable();
  const runFrom = Date.now();
  const saves = new Recorder("annotators autosaving (PUT assignment)");
  const pages = new Recorder("managers paging (GET documents)");
  const [logs, paging] = await Promise.all([
    runAnnotators(product.base, org.annotators, { seconds: SECONDS, rate: SAVE_RATE, recorder: saves }),
    runManagers(product.base, org, org.managers, { seconds: SECONDS, rate: PAGE_RATE, recorder: pages }),
  ]);
  const runTo = Date.now() + 2000;
  const loadAfter = loadAverage();
  lag.disable();
  const self = process.cpuUsage(cpuBefore.self);
  const share = (s: number) => `${s.toFixed(1)} s (${((100 * s) / SECONDS).toFixed(0)}% of one core)`;
  const cpuLine =
    `CPU used during the run: API ${share(cpuSeconds(api) - cpuBefore.api)}, worker ${share(cpuSeconds(worker) - cpuBefore.worker)}, ` +
    `PostgreSQL ${share(pgCpu() - cpuBefore.pg)}, ` +
    `load generator ${share((self.user + self.system) / 1e6)}; load generator event-loop delay p99 ${(lag.percentile(99) / 1e6).toFixed(0)} ms`;
  // A save sent just before the end may still be running in the API: let it finish before reading.
  await new Promise((r) => setTimeout(r, 2000));

  const { db } = await import("../../src/db/knex");
  const check = await checkAcknowledgedSaves(db, logs, org.typeIds);
  const { pgPool } = await import("../../src/db/pg-pool");
  // The check must be able to fail: set one assignment back by a version on purpose, check it
  // again (one lost save expected), and put the row back.
  const probe = logs.find((l) => l.acks.length >= 2);
  let probeLost = 0;
  if (probe) {
    const id = probe.annotator.assignmentId;
    const { version } = (await db("assignments").where({ id }).first("version")) as { version: number };
    await db("assignments").where({ id }).update({ version: version - 1 });
    probeLost = (await checkAcknowledgedSaves(db, [probe], org.typeIds)).lost;
    await db("assignments").where({ id }).update({ version });
  }

  const inside = apiResponseTimes(product.logFile, runFrom, runTo);
  const insideLine = (ms: number[]) => {
    const r = new Recorder("");
    r.latencies.push(...ms);
    return `  as the API timed them (pino-http responseTime, ${ms.length} answers): p50 ${r.percentile(50).toFixed(0)}, p95 ${r.percentile(95).toFixed(0)}, p99 ${r.percentile(99).toFixed(0)} ms`;
  };
  console.log(`\n[${elapsed()}] results (${SECONDS} s; load average at the end: ${loadAfter})`);
  console.log(saves.summary(SECONDS, org.annotators.length * SAVE_RATE));
  const conflicts = logs.reduce((n, l) => n + l.conflicts, 0);
  const unanswered = logs.reduce((n, l) => n + l.unanswered.length, 0);
  console.log(insideLine(inside.saves));
  console.log(`  saves acknowledged: ${check.acknowledged}; unanswered (timed out or in flight at the end): ${unanswered}; 409 stale_version after one: ${conflicts}`);
  console.log(pages.summary(SECONDS, org.managers.length * PAGE_RATE));
  console.log(insideLine(inside.pages));
  console.log(`  pages read: ${paging.pages} (${paging.rows} rows) over ${paging.walks} finished walks; rows met twice within a walk: ${paging.rowsSeenTwice}`);
  const refusals = [...logs.flatMap((l) => l.refusals), ...paging.refusals];
  if (refusals.length) console.log(`first refusals: ${refusals.slice(0, 3).map((r) => `${r.status} ${r.body}`).join(" | ")}`);
  console.log(cpuLine);
  const errorLines = fs.readFileSync(product.logFile, "utf8").split("\n").filter((l) => /"level":(50|60)/.test(l));
  console.log(`API and worker: RSS ${rssMb(api).toFixed(0)} MB and ${rssMb(worker).toFixed(0)} MB; error lines logged: ${errorLines.length}${errorLines[0] ? ` (first: ${errorLines[0].slice(0, 300)})` : ""}`);
  if (check.unexplainedVersions) console.log(`versions in the database no save explains: ${check.unexplainedVersions}`);
  if (check.firstProblem) console.log(`first lost save: ${check.firstProblem}`);
  console.log(`the check itself: an assignment set back by one version on purpose shows ${probeLost} lost save${probeLost === 1 ? "" : "s"} (expected 1)`);
  console.log(`acknowledged saves lost: ${check.lost}`);

  const serverErrors = saves.count((s) => s >= 500) + pages.count((s) => s >= 500);
  const clean = check.lost === 0 && check.unexplainedVersions === 0 && serverErrors === 0 && paging.rowsSeenTwice === 0 && saves.errors + pages.errors === 0 && probeLost === 1;
  console.log(clean ? "PASS: no 5xx, no connection error or timeout, no lost save, no repeated row" : "FAIL: see the figures above");
  await db.destroy();
  await pgPool.end();
  process.exitCode = clean ? 0 : 1;
} finally {
  await product?.stop();
  clearTimeout(watchdog);
  // The product's log is kept when something failed (its path is printed above).
  if (product && process.exitCode === 0) fs.rmSync(path.dirname(product.logFile), { recursive: true, force: true });
}
