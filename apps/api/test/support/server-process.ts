import { type ChildProcess, spawn } from "node:child_process";
import net from "node:net";
import path from "node:path";
import { afterAll } from "vitest";

// The API and its workers as processes of their own (src/server.ts, src/worker.ts), as in
// production, for tests that kill or restart them. Every process started here is killed after
// the file's tests if it is still running.
const API_DIR = path.resolve(import.meta.dirname, "../..");
const children: ChildProcess[] = [];
afterAll(() => {
  for (const c of children) if (isRunning(c)) c.kill("SIGKILL");
});

export const isRunning = (c: ChildProcess) => c.exitCode === null && c.signalCode === null;

/** A port on 127.0.0.1 that was free a moment ago. */
export const freePort = () =>
  new Promise<number>((resolve) => {
    const srv = net.createServer().listen(0, "127.0.0.1", () => {
      const p = (srv.address() as net.AddressInfo).port;
      srv.close(() => resolve(p));
    });
  });

/**
 * Runs an entry point of the API package with this process's environment plus `env`. It is node
 * itself with tsx's loader (not the tsx launcher, which would leave its node child running when
 * it is killed), so that a signal hits the process doing the work. Output is dropped unless
 * `stdout: "pipe"` (stderr then goes to the test's).
 */
export function spawnApiEntry(entry: "src/server.ts" | "src/worker.ts", env: Record<string, string>, stdout: "ignore" | "pipe" = "ignore"): ChildProcess {
  const child = spawn(process.execPath, ["--import", "tsx", entry], {
    cwd: API_DIR,
    env: { ...process.env, ...env },
    stdio: stdout === "pipe" ? ["ignore", "pipe", "inherit"] : "ignore",
  });
  children.push(child);
  return child;
}

export type ApiProcess = { child: ChildProcess; url: string; /** stdout so far (with stdout: "pipe"). */ output: () => string };

/** Starts src/server.ts on a free port of 127.0.0.1 and waits (45 s at most) until /api/health answers. */
export async function startApiProcess(options: { env?: Record<string, string>; stdout?: "ignore" | "pipe" } = {}): Promise<ApiProcess> {
  const port = await freePort();
  const child = spawnApiEntry("src/server.ts", { LOG_LEVEL: "silent", AUTH_RATE_LIMIT: "1000", ...options.env, PORT: String(port), HOST: "127.0.0.1" }, options.stdout);
  let out = "";
  child.stdout?.on("data", (d: Buffer) => (out += d.toString()));
  const url = `http://127.0.0.1:${port}`;
  const deadline = Date.now() + 45_000;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`API exited with ${child.exitCode}`);
    const ok = await fetch(`${url}/api/health`).then((r) => r.ok, () => false);
    if (ok) return { child, url, output: () => out };
    if (Date.now() > deadline) throw new Error("API did not start within 45 s");
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** Sends `signal` and waits for the process to exit. */
export async function signalAndWait(child: ChildProcess, signal: NodeJS.Signals): Promise<void> {
  if (!isRunning(child)) return;
  const exited = new Promise((r) => child.once("exit", r));
  child.kill(signal);
  await exited;
}

/** SIGTERM, then SIGKILL if it has not exited within `graceMs`. */
export async function stopProcess(child: ChildProcess, graceMs = 15_000): Promise<void> {
  if (!isRunning(child)) return;
  const exited = new Promise((r) => child.once("exit", r));
  child.kill("SIGTERM");
  await Promise.race([exited, new Promise((r) => setTimeout(r, graceMs))]);
  if (isRunning(child)) child.kill("SIGKILL");
}
