import request from "supertest";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/knex";
import { TEST_PASSWORD, type TestServer, signUpFounder, startTestServer, uniqueEmail } from "./support/http";
import { waitForMail } from "./support/mail";
import { startTestWorkers } from "./support/workers";

let server: TestServer;
beforeAll(async () => {
  server = await startTestServer();
  await startTestWorkers();
});

function sessionCookie(res: request.Response): string | undefined {
  const cookies = ([] as string[]).concat(res.headers["set-cookie"] ?? []);
  return cookies.find((c) => c.startsWith("tagloom_session="));
}

describe("sign-up", () => {
  it("creates the user, an organization with the user as admin, and signs in", async () => {
    const email = uniqueEmail();
    const agent = server.agent();
    const res = await agent
      .post("/api/auth/sign-up")
      .send({ email: email.toUpperCase(), password: TEST_PASSWORD, name: "Ada Quell", organizationName: "Fernhollow Lab" });
    expect(res.status).toBe(201);
    const cookie = sessionCookie(res)!;
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).not.toMatch(/Secure/); // test mode; Secure outside development
    expect(res.body.user).toMatchObject({ email, name: "Ada Quell", emailVerified: false });
    expect(res.body.memberships).toEqual([{ organizationId: res.body.organizationId, organizationName: "Fernhollow Lab", role: "admin" }]);
    const me = await agent.get("/api/me");
    expect(me.status).toBe(200);
    expect(me.body.user.email).toBe(email);
    const row = await db("auth_user").where({ email }).first();
    expect(row.password_hash).toMatch(/^\$argon2id\$/);
  });

  it("answers invalid input with 400, field details, and creates nothing", async () => {
    const before = await db("auth_user").count({ n: "*" }).first();
    const res = await server.agent().post("/api/auth/sign-up").send({ email: "not-an-address", password: "short", name: "" });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe("validation_failed");
    expect(Object.keys(res.body.error.details.fields).sort()).toEqual(["email", "name", "organizationName", "password"]);
    const after = await db("auth_user").count({ n: "*" }).first();
    expect(after).toEqual(before);
  });

  it("refuses a second account for the same address with 409", async () => {
    const { email } = await signUpFounder(server);
    const res = await server.agent().post("/api/auth/sign-up").send({ email, password: TEST_PASSWORD, name: "Other", organizationName: "Other Org" });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe("email_taken");
  });

  it("e-mails a single-use confirmation link that verifies the address", async () => {
    const { agent, email } = await signUpFounder(server);
    const mail = await waitForMail(email, /Confirm your e-mail/);
    const token = new URL(mail.link).searchParams.get("token")!;
    expect((await agent.post("/api/auth/verify-email").send({ token })).status).toBe(204);
    expect((await agent.get("/api/me")).body.user.emailVerified).toBe(true);
    const again = await agent.post("/api/auth/verify-email").send({ token });
    expect(again.status).toBe(400);
    expect(again.body.error.code).toBe("invalid_link");
  });
});

describe("sign-in and sign-out", () => {
  it("gives the same answer for an unknown address and a wrong password", async () => {
    const { email } = await signUpFounder(server);
    const wrong = await server.agent().post("/api/auth/sign-in").send({ email, password: "wrong password!!" });
    const unknown = await server.agent().post("/api/auth/sign-in").send({ email: uniqueEmail("ghost"), password: "wrong password!!" });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body).toEqual(unknown.body);
  });

  it("issues a new session id at sign-in and ends the old one", async () => {
    const { agent, email } = await signUpFounder(server);
    const first = (await db("user_session").join("auth_user", "auth_user.id", "user_session.user_id").where("auth_user.email", email).select("user_session.id")).map((r) => r.id);
    const res = await agent.post("/api/auth/sign-in").send({ email, password: TEST_PASSWORD });
    expect(res.status).toBe(200);
    const cookie = sessionCookie(res)!;
    const newId = /tagloom_session=([^;]+)/.exec(cookie)![1];
    expect(first).not.toContain(newId);
    expect(await db("user_session").whereIn("id", first).count({ n: "*" }).first()).toEqual({ n: 0 });
    expect((await agent.get("/api/me")).status).toBe(200);
  });

  it("signs out: the session no longer works", async () => {
    const { agent } = await signUpFounder(server);
    expect((await agent.post("/api/auth/sign-out")).status).toBe(204);
    const me = await agent.get("/api/me");
    expect(me.status).toBe(401);
    expect(me.body.error.code).toBe("unauthenticated");
    // The session route says "nobody" with a 200, so a signed-out page load fails no request.
    expect((await agent.get("/api/auth/session")).body).toEqual({ me: null });
  });

  it("answers the session route with the signed-in user and memberships, the same as /api/me", async () => {
    const { agent } = await signUpFounder(server);
    const session = await agent.get("/api/auth/session");
    expect(session.status).toBe(200);
    expect(session.body.me).toEqual((await agent.get("/api/me")).body);
    expect(session.body.me.memberships).toHaveLength(1);
  });

  it("records sign-in in the organization's audit log", async () => {
    const { agent, email, orgId } = await signUpFounder(server);
    await agent.post("/api/auth/sign-in").send({ email, password: TEST_PASSWORD });
    const audit = await agent.get(`/api/orgs/${orgId}/audit`).query({ action: "user.signed_in" });
    expect(audit.status).toBe(200);
    expect(audit.body.items).toHaveLength(1);
    expect(audit.body.items[0]).toMatchObject({ action: "user.signed_in", actor: email });
  });
});

describe("request origin check", () => {
  it("refuses a state-changing request without an Origin, or from another site, and changes nothing", async () => {
    const email = uniqueEmail();
    const body = { email, password: TEST_PASSWORD, name: "X", organizationName: "Nowhere Co" };
    const none = await request(server.url).post("/api/auth/sign-up").send(body);
    expect(none.status).toBe(403);
    const foreign = await request(server.url).post("/api/auth/sign-up").set("Origin", "http://evil.example").send(body);
    expect(foreign.status).toBe(403);
    expect(foreign.body.error.message).toContain("http://evil.example");
    expect(await db("auth_user").where({ email }).first()).toBeUndefined();
  });
});

describe("password reset", () => {
  it("resets by an e-mailed single-use link and ends every session", async () => {
    const { agent, email } = await signUpFounder(server);
    const asked = await server.agent().post("/api/auth/password-reset/request").send({ email });
    expect(asked.status).toBe(202);
    const mail = await waitForMail(email, /Reset your Tagloom password/);
    const token = new URL(mail.link).searchParams.get("token")!;
    const newPassword = "a brand new passphrase";
    expect((await server.agent().post("/api/auth/password-reset/confirm").send({ token, password: newPassword })).status).toBe(204);
    expect((await agent.get("/api/me")).status).toBe(401);
    expect((await server.agent().post("/api/auth/sign-in").send({ email, password: TEST_PASSWORD })).status).toBe(401);
    expect((await server.agent().post("/api/auth/sign-in").send({ email, password: newPassword })).status).toBe(200);
    const reused = await server.agent().post("/api/auth/password-reset/confirm").send({ token, password: "yet another passphrase" });
    expect(reused.status).toBe(400);
    expect(reused.body.error.code).toBe("invalid_link");
  });

  it("answers the same for an unknown address and sends nothing", async () => {
    const ghost = uniqueEmail("ghost");
    const res = await server.agent().post("/api/auth/password-reset/request").send({ email: ghost });
    expect(res.status).toBe(202);
    expect(await db("outbound_emails").where({ to_address: ghost }).first()).toBeUndefined();
  });

  it("refuses an expired link", async () => {
    const { email } = await signUpFounder(server);
    await server.agent().post("/api/auth/password-reset/request").send({ email });
    const mail = await waitForMail(email, /Reset your Tagloom password/);
    const token = new URL(mail.link).searchParams.get("token")!;
    await db("email_tokens").where({ email, purpose: "reset_password" }).update({ expires_at: new Date(Date.now() - 1000) });
    const res = await server.agent().post("/api/auth/password-reset/confirm").send({ token, password: "a brand new passphrase" });
    expect(res.status).toBe(400);
    expect((await server.agent().post("/api/auth/sign-in").send({ email, password: TEST_PASSWORD })).status).toBe(200);
  });
});

describe("rate limit", () => {
  it("answers 429 after the configured number of sign-in attempts from one address", async () => {
    const limited = await startTestServer({ authRateLimit: 3 });
    const statuses: number[] = [];
    for (let i = 0; i < 5; i++) {
      statuses.push((await limited.agent().post("/api/auth/sign-in").send({ email: "nobody@example.test", password: "whatever it is" })).status);
    }
    expect(statuses).toEqual([401, 401, 401, 429, 429]);
    const last = await limited.agent().post("/api/auth/sign-in").send({ email: "nobody@example.test", password: "x" });
    expect(last.body.error.code).toBe("rate_limited");
  });
});
