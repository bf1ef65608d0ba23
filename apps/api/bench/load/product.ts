import { type ChildProcess, spawn, spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { type MailCatcher, startMailCatcher } from "@tagloom/fakes";
import { type TempPostgres, startTempPostgres } from "../../../../docker-free-scripts/lib/temp-postgres.mjs";
import { freePort, stopChildren } from "../support/bench-product";

const apiDir = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "../..");
const webDir = path.resolve(apiDir, "../web");

export type LoadProduct = {
  base: string;
  api: ChildProcess;
  worker: ChildProcess;
  logFile: string;
  /** The PostgreSQL server's processes: the postmaster first, then its children (the backends and helpers). */
  postgresPids: () => number[];
  stop: () => Promise<void>;
};

function childPids(parent: number): number[] {
  const out: number[] = [];
  for (const entry of fs.readdirSync("/proc")) {
    if (!/^\d+$/.test(entry)) continue;
    try {
      const stat = fs.readFileSync(`/proc/${entry}/stat`, "utf8");
      // Field 4 (after the command name in parentheses and the state) is the parent's pid.
      if (Number(stat.slice(stat.lastIndexOf(")") + 2).split(" ")[1]) === parent) out.push(Number(entry));
    } catch {}
  }
  return out;
}

/** Builds the web app the way `npm start` does (fonts copied, then vite build into apps/web/dist). */
function buildWebApp(): string {
  const dist = path.join(webDir, "dist");
  if (process.env.LOAD_REUSE_WEB_BUILD === "1" && fs.existsSync(path.join(dist, "index.html"))) return dist;
  for (const [cmd, args] of [
    [process.execPath, ["scripts/copy-fonts.mjs"]],
    [path.join(webDir, "node_modules/.bin/vite"), ["build", "--logLevel", "warn"]],
  ] as const) {
    const res = spawnSync(cmd, [...args], { cwd: webDir, stdio: "inherit" });
    if (res.status !== 0) throw new Error(`web build failed: ${path.basename(cmd)} ${args.join(" ")} exited with ${res.status}`);
  }
  return dist;
}

async function waitForHealth(base: string, child: ChildProcess): Promise<void> {
  for (let i = 0; ; i++) {
    if (await fetch(`${base}/api/health`).then((r) => r.ok).catch(() => false)) return;
    if (child.exitCode !== null) throw new Error(`the API exited (code ${child.exitCode}) before answering`);
    if (i > 300) throw new Error("the API did not answer /api/health within 60 s");
    await new Promise((r) => setTimeout(r, 200));
  }
}

/**
 * The product as `npm start` runs it, on a throwaway PostgreSQL: the web app built and served by
 * the API (WEB_DIST), one worker process beside it, and a mail catcher for the e-mails the
 * product sends. The API keeps its default limits: AUTH_RATE_LIMIT and TRUST_PROXY are taken out
 * of the environment so that nothing inherited can raise or bypass them. Process output goes to
 * a log file (the API logs every request, as it does under `npm start`).
 */
export async function startLoadProduct(): Promise<LoadProduct> {
  const dist = buildWebApp();
  const pg: TempPostgres = await startTempPostgres({ label: "bench-load" });
  const mail: MailCatcher = await startMailCatcher();
  const children: ChildProcess[] = [];
  const logDir = fs.mkdtempSync(path.join(os.tmpdir(), "tagloom-bench-load-"));
  const logFile = path.join(logDir, "product.log");
  const log = fs.openSync(logFile, "a");
  const stop = async () => {
    await stopChildren(children);
    await mail.stop();
    pg.stop();
    fs.closeSync(log);
  };
  try {
    const port = await freePort();
    const base = `http://127.0.0.1:${port}`;
    const productEnv: NodeJS.ProcessEnv = {
      ...process.env,
      DATABASE_URL: pg.url,
      NODE_ENV: "development",
      HOST: "127.0.0.1",
      PORT: String(port),
      PUBLIC_URL: base,
      WEB_DIST: dist,
      SMTP_PORT: String(mail.smtpPort),
      MAIL_CATCHER_URL: mail.httpUrl,
      UPLOAD_DIR: path.join(logDir, "uploads"),
      LOG_LEVEL: process.env.LOAD_LOG_LEVEL ?? "info",
    };
    delete productEnv.AUTH_RATE_LIMIT;
    delete productEnv.TRUST_PROXY;
    // This process seeds rows and opens sessions through the repositories, so it uses the same database.
    Object.assign(process.env, { DATABASE_URL: pg.url, NODE_ENV: "development", LOG_LEVEL: "warn", SMTP_PORT: String(mail.smtpPort) });
    delete process.env.AUTH_RATE_LIMIT;
    delete process.env.TRUST_PROXY;
    const { migrateLatest } = await import("../../src/db/migration-source");
    const { db } = await import("../../src/db/knex");
    await migrateLatest(db);

    const start = (entry: string) => {
      // LOAD_PROFILE_DIR=<dir> writes a CPU profile of each product process there.
      const profile = process.env.LOAD_PROFILE_DIR ? ["--cpu-prof", "--cpu-prof-dir", process.env.LOAD_PROFILE_DIR] : [];
      const child = spawn(process.execPath, [...profile, "--import", "tsx", entry], { cwd: apiDir, env: productEnv, stdio: ["ignore", log, log] });
      children.push(child);
      return child;
    };
    const api = start("src/server.ts");
    const worker = start("src/worker.ts");
    await waitForHealth(base, api);
    const page = await fetch(`${base}/`);
    const html = await page.text();
    if (page.status !== 200 || !html.includes("<script")) throw new Error(`the API does not serve the built web app (GET / answered ${page.status})`);
    const postmaster = Number(fs.readFileSync(path.join(pg.dir, "data", "postmaster.pid"), "utf8").split("\n")[0]);
    const postgresPids = () => [postmaster, ...childPids(postmaster)];
    return { base, api, worker, logFile, postgresPids, stop };
  } catch (err) {
    await stop();
    throw err;
  }
}
