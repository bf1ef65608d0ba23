import { type ChildProcess, spawn } from "node:child_process";
import fs from "node:fs";
import net from "node:net";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { type MailCatcher, startMailCatcher } from "@tagloom/fakes";
import { type TempPostgres, startTempPostgres } from "../../../../docker-free-scripts/lib/temp-postgres.mjs";

const apiDir = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "../..");

/** A free TCP port on 127.0.0.1 (taken and released at once). */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.on("error", reject);
    srv.listen(0, "127.0.0.1", () => {
      const { port } = srv.address() as net.AddressInfo;
      srv.close(() => resolve(port));
    });
  });
}

/** Stops child processes: SIGTERM, then SIGKILL after 8 s. */
export function stopChildren(children: readonly ChildProcess[]): Promise<void> {
  return Promise.all(
    children.map(
      (c) =>
        new Promise<void>((resolve) => {
          if (c.exitCode !== null) return resolve();
          c.once("exit", () => resolve());
          c.kill("SIGTERM");
          setTimeout(() => c.kill("SIGKILL"), 8000).unref();
        }),
    ),
  ).then(() => undefined);
}

/** Resident set size of a process in MB, from /proc (Linux). */
export function rssMb(pid: number): number {
  try {
    const kb = Number(/VmRSS:\s+(\d+)/.exec(fs.readFileSync(`/proc/${pid}/status`, "utf8"))?.[1] ?? 0);
    return kb / 1024;
  } catch {
    return 0;
  }
}

export type BenchProduct = {
  base: string;
  api: ChildProcess;
  orgId: string;
  userId: string;
  email: string;
  headers: Record<string, string>;
  /** A JSON request as the founder to /api/orgs/:orgId + path; a status other than 2xx throws. */
  call: (method: string, path: string, body?: object) => Promise<Record<string, unknown>>;
  stop: () => Promise<void>;
};

/**
 * A throwaway PostgreSQL (migrated), a mail catcher and the API in its own process, with one
 * signed-up founder. DATABASE_URL points at the database in this process too, so a benchmark can
 * seed rows through the repositories. Call stop() in a finally block.
 */
export async function startBenchProduct(label: string): Promise<BenchProduct> {
  const pg: TempPostgres = await startTempPostgres({ label });
  const mail: MailCatcher = await startMailCatcher();
  const children: ChildProcess[] = [];
  const stop = async () => {
    await stopChildren(children);
    await mail.stop();
    pg.stop();
  };
  try {
    process.env.DATABASE_URL = pg.url;
    process.env.NODE_ENV = "development";
    process.env.LOG_LEVEL = "warn";
    process.env.SMTP_PORT = String(mail.smtpPort);
    const { migrateLatest } = await import("../../src/db/migration-source");
    const { db } = await import("../../src/db/knex");
    await migrateLatest(db);
    const port = await freePort();
    const base = `http://127.0.0.1:${port}`;
    const api = spawn(process.execPath, ["--import", "tsx", "src/server.ts"], {
      cwd: apiDir,
      env: { ...process.env, PORT: String(port), HOST: "127.0.0.1", AUTH_RATE_LIMIT: "100000" },
      stdio: ["ignore", "inherit", "inherit"],
    });
    children.push(api);
    for (let i = 0; ; i++) {
      if (await fetch(`${base}/api/health`).then((r) => r.ok).catch(() => false)) break;
      if (i > 150) throw new Error("the API did not start");
      await new Promise((r) => setTimeout(r, 200));
    }
    const email = "lead@bench.example.test";
    const res = await fetch(`${base}/api/auth/sign-up`, {
      method: "POST",
      headers: { "Content-Type": "application/json", Origin: base },
      body: JSON.stringify({ email, password: "correct horse battery", name: "Bench Lead", organizationName: "Bench Archive" }),
    });
    const body = (await res.json()) as { organizationId: string; user: { id: string } };
    const cookie = res.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
    const headers = { Origin: base, Cookie: cookie };
    const call = async (method: string, p: string, json?: object) => {
      const r = await fetch(`${base}/api/orgs/${body.organizationId}${p}`, {
        method,
        headers: { ...headers, "Content-Type": "application/json" },
        body: json ? JSON.stringify(json) : undefined,
      });
      if (!r.ok) throw new Error(`${method} ${p}: ${r.status} ${await r.text()}`);
      return r.json() as Promise<Record<string, unknown>>;
    };
    return { base, api, orgId: body.organizationId, userId: body.user.id, email, headers, call, stop };
  } catch (err) {
    await stop();
    throw err;
  }
}
