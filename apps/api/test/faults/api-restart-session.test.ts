import { describe, expect, it } from "vitest";
import { uniqueEmail } from "../support/http";
import { signalAndWait, startApiProcess } from "../support/server-process";

// The API as its own process (src/server.ts), killed and started again: sessions live in
// PostgreSQL, so a cookie made before the restart still signs the user in after it.
describe("API process restarted", () => {
  it("a session cookie made before a SIGKILL restart still works after it", async () => {
    const first = await startApiProcess();
    const email = uniqueEmail("restart");
    const signUp = await fetch(`${first.url}/api/auth/sign-up`, {
      method: "POST",
      headers: { "Content-Type": "application/json", Origin: first.url },
      body: JSON.stringify({ email, password: "a long passphrase", name: "Rhea Restart", organizationName: "Restart Lane Office" }),
    });
    expect(signUp.status).toBe(201);
    const cookie = signUp.headers.getSetCookie().find((c) => c.startsWith("tagloom_session="))!.split(";")[0]!;
    expect((await fetch(`${first.url}/api/me`, { headers: { Cookie: cookie } })).status).toBe(200);

    await signalAndWait(first.child, "SIGKILL");

    const second = await startApiProcess();
    const me = await fetch(`${second.url}/api/me`, { headers: { Cookie: cookie } });
    expect(me.status).toBe(200);
    expect(((await me.json()) as { user: { email: string } }).user.email).toBe(email);
    // And a made-up cookie is still refused: the check is real.
    expect((await fetch(`${second.url}/api/me`, { headers: { Cookie: "tagloom_session=abcdefghijklmnopqrstuvwxyz012345" } })).status).toBe(401);
    await signalAndWait(second.child, "SIGTERM");
  }, 120_000);
});
