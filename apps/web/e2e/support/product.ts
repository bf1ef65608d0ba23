import { type ChildProcess, spawn, spawnSync } from "node:child_process";
import fs from "node:fs";
import net from "node:net";
import path from "node:path";
import { type MailCatcher, type PaymentsFake, startMailCatcher, startPaymentsFake } from "@tagloom/fakes";
import { type TempPostgres, startTempPostgres } from "../../../../docker-free-scripts/lib/temp-postgres.mjs";

const webDir = path.resolve(import.meta.dirname, "../..");
const apiDir = path.resolve(webDir, "../api");
const tsx = path.join(apiDir, "node_modules/.bin/tsx");

export type Product = {
  baseUrl: string;
  mailUrl: string;
  paymentsUrl: string;
  /** With `demo`: the demo API token's secret and the demo corpus (printed once by the seed). */
  demoToken?: string | null;
  demoCorpusId?: string | null;
  stop: () => Promise<void>;
  /** Stops the payments fake alone (the payments service is down; the rest keeps running). */
  stopPayments: () => Promise<void>;
  /** The last lines the API and the worker printed (warnings and errors; the worker's jobs too), for a failing test's message. */
  logTail: (chars?: number) => string;
};

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.on("error", reject);
    srv.listen(0, "127.0.0.1", () => {
      const { port } = srv.address() as net.AddressInfo;
      srv.close(() => resolve(port));
    });
  });
}

async function waitForHealth(url: string, child: ChildProcess, log: () => string, timeoutMs = 60_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`the API exited (${child.exitCode}):\n${log()}`);
    try {
      const res = await fetch(`${url}/api/health`);
      if (res.ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`the API did not become healthy within ${timeoutMs} ms:\n${log()}`);
}

/** Waits for the worker's "worker started" line: its queues are polled from then on. */
async function waitForWorker(child: ChildProcess, log: () => string, timeoutMs = 60_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (child.exitCode !== null || child.signalCode !== null) throw new Error(`the worker exited (${child.exitCode ?? child.signalCode}):\n${log()}`);
    if (log().includes('"worker started"')) return;
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`the worker did not start within ${timeoutMs} ms:\n${log()}`);
}

/** Runs a command to its end without blocking this process's event loop. */
function runToEnd(cmd: string, args: string[], options: { cwd: string; env: NodeJS.ProcessEnv }, timeoutMs: number): Promise<{ status: number | null; stdout: string; stderr: string }> {
  return new Promise((resolve, reject) => {
    const child = spawn(cmd, args, { ...options, stdio: ["ignore", "pipe", "pipe"] });
    let stdout = "";
    let stderr = "";
    child.stdout.on("data", (d: Buffer) => (stdout += d.toString()));
    child.stderr.on("data", (d: Buffer) => (stderr += d.toString()));
    const timer = setTimeout(() => child.kill("SIGKILL"), timeoutMs);
    child.on("error", reject);
    child.on("close", (status) => {
      clearTimeout(timer);
      resolve({ status, stdout, stderr });
    });
  });
}

function stopChild(child: ChildProcess): Promise<void> {
  if (child.exitCode !== null || child.signalCode !== null) return Promise.resolve();
  return new Promise((resolve) => {
    const timer = setTimeout(() => child.kill("SIGKILL"), 8000);
    child.once("exit", () => {
      clearTimeout(timer);
      resolve();
    });
    child.kill("SIGTERM");
  });
}

/**
 * Starts the whole product the way `npm start` does, but private to this test run: a throwaway
 * PostgreSQL, the migrations, the mail catcher, the payments fake, the API serving the built web
 * app, and a worker; with `demo`, also the demo organization of `npm start` (its sign-ins are in
 * the README).
 */
export async function startProduct(options: { demo?: boolean } = {}): Promise<Product> {
  const dist = path.join(webDir, "dist");
  if (!fs.existsSync(path.join(dist, "index.html"))) {
    const build = spawnSync("npx", ["vite", "build"], { cwd: webDir, stdio: "inherit" });
    if (build.status !== 0) throw new Error("vite build failed");
  }
  let pg: TempPostgres | null = null;
  let mail: MailCatcher | null = null;
  let payments: PaymentsFake | null = null;
  const children: ChildProcess[] = [];
  try {
    pg = await startTempPostgres({ label: "e2e" });
    mail = await startMailCatcher();
    const port = await freePort();
    const baseUrl = `http://127.0.0.1:${port}`;
    payments = await startPaymentsFake({ webhookUrl: `${baseUrl}/api/billing/webhook` });
    const env = {
      ...process.env,
      NODE_ENV: "development",
      DATABASE_URL: pg.url,
      HOST: "127.0.0.1",
      PORT: String(port),
      PUBLIC_URL: baseUrl,
      WEB_DIST: dist,
      SMTP_PORT: String(mail.smtpPort),
      MAIL_CATCHER_URL: mail.httpUrl,
      STRIPE_API_PORT: String(payments.port),
      LOG_LEVEL: "warn",
      AUTH_RATE_LIMIT: "1000",
    };
    const migrate = spawnSync(tsx, ["src/db/migrate-cli.ts", "latest"], { cwd: apiDir, env, encoding: "utf8" });
    if (migrate.status !== 0) throw new Error(`migrations failed: ${migrate.stderr}${migrate.stdout}`);
    let output = "";
    const spawnApp = (entry: string, name: string, extraEnv: NodeJS.ProcessEnv = {}) => {
      const child = spawn(tsx, [entry], { cwd: apiDir, env: { ...env, ...extraEnv }, stdio: ["ignore", "pipe", "pipe"] });
      const keep = (d: Buffer) => (output = (output + d.toString()).slice(-20_000));
      child.stdout?.on("data", keep);
      child.stderr?.on("data", keep);
      child.on("exit", (code, signal) => (output = `${output}\n[the ${name} exited: ${signal ?? code}]\n`.slice(-20_000)));
      children.push(child);
      return child;
    };
    const api = spawnApp("src/server.ts", "API");
    // The worker logs its jobs (info), so a failing browser test can show what the worker did.
    const worker = spawnApp("src/worker.ts", "worker", { LOG_LEVEL: "info" });
    await waitForHealth(baseUrl, api, () => output);
    await waitForWorker(worker, () => output);
    // The demo loads beside the running product, as in npm start: its seats are paid on the
    // payments fake (webhooks to the API) and its taggers are trained by the worker.
    let demoToken: string | null = null;
    let demoCorpusId: string | null = null;
    if (options.demo) {
      // Not spawnSync: the payments fake and the mail catcher live in this process and must answer.
      const seed = await runToEnd(tsx, ["src/seed/seed-cli.ts"], { cwd: apiDir, env }, 600_000);
      if (seed.status !== 0) throw new Error(`demo data failed: ${seed.stderr}${seed.stdout}`);
      demoToken = /^DEMO_API_TOKEN=(.+)$/m.exec(seed.stdout)?.[1] ?? null;
      demoCorpusId = /^DEMO_CORPUS_ID=(.+)$/m.exec(seed.stdout)?.[1] ?? null;
    }
    const started = { pg, mail, payments };
    return {
      baseUrl,
      mailUrl: mail.httpUrl,
      paymentsUrl: payments.url,
      demoToken,
      demoCorpusId,
      stop: async () => {
        await Promise.all(children.map(stopChild));
        await started.mail.stop();
        await started.payments.stop();
        started.pg.stop();
      },
      stopPayments: () => started.payments.stop(),
      logTail: (chars = 6000) => output.slice(-chars),
    };
  } catch (err) {
    await Promise.all(children.map(stopChild));
    await mail?.stop();
    await payments?.stop();
    pg?.stop();
    throw err;
  }
}
