// Runs the product's processes for `npm start`: the local fakes, the API (serving the built web
// app) and one worker. Restarts a process that dies (at most 5 times a minute), and stops them all
// on SIGTERM. Started detached by start.sh; its pid is in .data/run/supervisor.pid.
import { spawn } from "node:child_process";
import path from "node:path";
import { fileURLToPath } from "node:url";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "../..");
const tsx = path.join(root, "node_modules/.bin/tsx");
const procs = [
  { name: "fakes", cwd: path.join(root, "apps/fakes"), args: ["src/main.ts"] },
  { name: "api", cwd: path.join(root, "apps/api"), args: ["src/server.ts"] },
  { name: "worker", cwd: path.join(root, "apps/api"), args: ["src/worker.ts"] },
];
const workers = Math.max(1, Number(process.env.TAGLOOM_WORKERS ?? 1));
for (let i = 2; i <= workers; i++) procs.push({ name: `worker-${i}`, cwd: path.join(root, "apps/api"), args: ["src/worker.ts"] });

let stopping = false;
const children = new Map();
const restarts = new Map();

function log(msg) {
  console.log(`[supervisor ${new Date().toISOString()}] ${msg}`);
}

function start(p) {
  const child = spawn(tsx, p.args, { cwd: p.cwd, env: process.env, stdio: ["ignore", "pipe", "pipe"] });
  const prefix = (d) =>
    d
      .toString()
      .split("\n")
      .filter(Boolean)
      .map((l) => `[${p.name}] ${l}`)
      .join("\n");
  child.stdout.on("data", (d) => console.log(prefix(d)));
  child.stderr.on("data", (d) => console.error(prefix(d)));
  child.on("exit", (code, signal) => {
    children.delete(p.name);
    if (stopping) return;
    const now = Date.now();
    const recent = (restarts.get(p.name) ?? []).filter((t) => now - t < 60_000);
    if (recent.length >= 5) {
      log(`${p.name} keeps exiting (last: code ${code}, signal ${signal}); giving up on it`);
      return;
    }
    restarts.set(p.name, [...recent, now]);
    log(`${p.name} exited (code ${code}, signal ${signal}); restarting in 2 s`);
    setTimeout(() => !stopping && start(p), 2000);
  });
  children.set(p.name, child);
}

function stopAll() {
  if (stopping) return;
  stopping = true;
  log("stopping");
  for (const child of children.values()) child.kill("SIGTERM");
  const deadline = setTimeout(() => {
    for (const child of children.values()) child.kill("SIGKILL");
    process.exit(0);
  }, 10_000);
  const check = setInterval(() => {
    if (children.size === 0) {
      clearTimeout(deadline);
      clearInterval(check);
      process.exit(0);
    }
  }, 100);
}
process.on("SIGTERM", stopAll);
process.on("SIGINT", stopAll);

for (const p of procs) start(p);
log(`started ${procs.map((p) => p.name).join(", ")}`);
