import { describe, expect, it } from "vitest";
import { uniqueEmail } from "./support/http";
import { signalAndWait, startApiProcess } from "./support/server-process";

// The API logs every request (pino-http, level info, as `npm start` runs it). Session cookies and
// API tokens are credentials: whoever reads the log must not be able to sign in with them.
describe("request log", () => {
  it("keeps session cookies, Set-Cookie answers, bearer tokens and e-mailed link tokens out of the log lines", async () => {
    const api = await startApiProcess({ env: { NODE_ENV: "development", LOG_LEVEL: "info" }, stdout: "pipe" });
    const { url } = api;

    const signUp = await fetch(`${url}/api/auth/sign-up`, {
      method: "POST",
      headers: { "Content-Type": "application/json", Origin: url },
      body: JSON.stringify({ email: uniqueEmail("log"), password: "a long passphrase", name: "Lorne Ledger", organizationName: "Ledgerfold Office" }),
    });
    expect(signUp.status).toBe(201);
    const cookie = signUp.headers.getSetCookie().find((c) => c.startsWith("tagloom_session="))!.split(";")[0]!;
    const sessionId = cookie.slice("tagloom_session=".length);
    expect((await fetch(`${url}/api/me`, { headers: { Cookie: cookie } })).status).toBe(200);
    const token = "tgl_notarealtokenbutshapedlikeonexxxxxxxxxxxxxxx";
    await fetch(`${url}/api/v1/corpora/00000000-0000-4000-8000-000000000000/tag`, {
      method: "POST",
      headers: { "Content-Type": "application/json", Authorization: `Bearer ${token}` },
      body: JSON.stringify({ text: "Wren Odalsby signed." }),
    });

    // The links e-mails carry: a reset page with its token, an invitation by its token (page and API).
    const resetToken = "resetsecretvaluethatmustnotbelogged01";
    const inviteToken = "invitesecretvaluethatmustnotbelogged02";
    await fetch(`${url}/reset-password?token=${resetToken}&from=mail`);
    await fetch(`${url}/api/invitations/${inviteToken}`);
    await fetch(`${url}/api/invitations/${inviteToken}/accept`, { method: "POST", headers: { Origin: url, Cookie: cookie } });

    // pino-http writes its line when the answer is finished; give the last one a moment.
    const until = Date.now() + 10_000;
    while (!api.output().includes("/accept") && Date.now() < until) await new Promise((r) => setTimeout(r, 50));
    await signalAndWait(api.child, "SIGTERM");
    const log = api.output();

    const lines = log.split("\n").filter((l) => l.includes('"request completed"'));
    const meLine = lines.find((l) => l.includes('"url":"/api/me"'));
    const signUpLine = lines.find((l) => l.includes('"url":"/api/auth/sign-up"'));
    const tagLine = lines.find((l) => l.includes("/api/v1/corpora"));
    // The requests are logged (so the check below looks at real lines)...
    expect(meLine).toBeDefined();
    expect(signUpLine).toBeDefined();
    expect(tagLine).toBeDefined();
    // ...with the credentials replaced, and nowhere else in the output either.
    expect(JSON.parse(meLine!).req.headers.cookie).toBe("[redacted]");
    expect(JSON.parse(signUpLine!).res.headers["set-cookie"]).toBe("[redacted]");
    expect(JSON.parse(tagLine!).req.headers.authorization).toBe("[redacted]");
    expect(log).not.toContain(sessionId);
    expect(log).not.toContain(token);
    const resetLine = lines.find((l) => l.includes('"url":"/reset-password'));
    expect(JSON.parse(resetLine!).req.url).toBe("/reset-password?token=[redacted]&from=mail");
    expect(JSON.parse(resetLine!).req.query.token).toBe("[redacted]");
    expect(lines.filter((l) => l.includes('"url":"/api/invitations/[redacted]')).length).toBe(2);
    expect(log).not.toContain(resetToken);
    expect(log).not.toContain(inviteToken);
  }, 120_000);
});
