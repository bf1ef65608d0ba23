import { type ChildProcess, spawn } from "node:child_process";
import net from "node:net";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { repoRoot } from "@/config/env";
import { uniqueEmail } from "../support/http";

// The API as its own process (src/server.ts), killed and started again: sessions live in
// PostgreSQL, so a cookie made before the restart still signs the user in after it.
const children: ChildProcess[] = [];
afterAll(() => {
  for (const c of children) if (c.exitCode === null && c.signalCode === null) c.kill("SIGKILL");
});

const freePort = () =>
  new Promise<number>((resolve) => {
    const srv = net.createServer().listen(0, "127.0.0.1", () => {
      const p = (srv.address() as net.AddressInfo).port;
      srv.close(() => resolve(p));
    });
  });

async function startApi(): Promise<{ child: ChildProcess; url: string }> {
  const port = await freePort();
  // node with tsx's loader (not the tsx launcher) so the signal reaches the process serving HTTP.
  const child = spawn(process.execPath, ["--import", "tsx", "src/server.ts"], {
    cwd: join(repoRoot, "apps/api"),
    env: { ...process.env, PORT: String(port), HOST: "127.0.0.1", LOG_LEVEL: "silent", AUTH_RATE_LIMIT: "1000" },
    stdio: "ignore",
  });
  children.push(child);
  const url = `http://127.0.0.1:${port}`;
  const deadline = Date.now() + 45_000;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`API exited with ${child.exitCode}`);
    const ok = await fetch(`${url}/api/health`).then((r) => r.ok, () => false);
    if (ok) return { child, url };
    if (Date.now() > deadline) throw new Error("API did not start within 45 s");
    await new Promise((r) => setTimeout(r, 100));
  }
}

describe("API process restarted", () => {
  it("a session cookie made before a SIGKILL restart still works after it", async () => {
    const first = await startApi();
    const email = uniqueEmail("restart");
    const signUp = await fetch(`${first.url}/api/auth/sign-up`, {
      method: "POST",
      headers: { "Content-Type": "application/json", Origin: first.url },
      body: JSON.stringify({ email, password: "a long passphrase", name: "Rhea Restart", organizationName: "Restart Lane Office" }),
    });
    expect(signUp.status).toBe(201);
    const cookie = signUp.headers.getSetCookie().find((c) => c.startsWith("tagloom_session="))!.split(";")[0]!;
    expect((await fetch(`${first.url}/api/me`, { headers: { Cookie: cookie } })).status).toBe(200);

    first.child.kill("SIGKILL");
    await new Promise((r) => first.child.once("exit", r));

    const second = await startApi();
    const me = await fetch(`${second.url}/api/me`, { headers: { Cookie: cookie } });
    expect(me.status).toBe(200);
    expect(((await me.json()) as { user: { email: string } }).user.email).toBe(email);
    // And a made-up cookie is still refused: the check is real.
    expect((await fetch(`${second.url}/api/me`, { headers: { Cookie: "tagloom_session=abcdefghijklmnopqrstuvwxyz012345" } })).status).toBe(401);
    second.child.kill("SIGTERM");
    await new Promise((r) => second.child.once("exit", r));
  }, 120_000);
});
