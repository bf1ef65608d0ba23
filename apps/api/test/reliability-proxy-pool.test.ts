import { describe, expect, it } from "vitest";
import { loadEnv } from "@/config/env";
import { db } from "@/db/knex";
import { pgPool } from "@/db/pg-pool";
import { signUpFounder, startTestServer, uniqueEmail } from "./support/http";

const sessions = async () => Number((await db("user_session").count<{ count: string }[]>("* as count"))[0]!.count);

async function tryWrongPasswords(agent: ReturnType<Awaited<ReturnType<typeof startTestServer>>["agent"]>, times: number) {
  const statuses: number[] = [];
  let last: { error?: { message: string } } = {};
  for (let i = 0; i < times; i += 1) {
    // Each attempt claims another client address; only a trusted proxy may say so.
    const res = await agent.post("/api/auth/sign-in").set("X-Forwarded-For", `198.51.100.${i + 1}`).send({ email: uniqueEmail("ghost"), password: "wrong password!!" });
    statuses.push(res.status);
    last = res.body;
  }
  return { statuses, last };
}

describe("trusted proxies are explicit", () => {
  it("by default ignores X-Forwarded-For from loopback: the sign-in limit holds whatever address is claimed", async () => {
    const server = await startTestServer({ authRateLimit: 3 });
    const before = await sessions();
    const { statuses, last } = await tryWrongPasswords(server.agent(), 4);
    expect(statuses).toEqual([401, 401, 401, 429]);
    expect(last.error?.message).toMatch(/Too many attempts from this address/);
    expect(await sessions()).toBe(before);
  });

  it("believes X-Forwarded-For only from peers named in the setting", async () => {
    const server = await startTestServer({ authRateLimit: 3, trustProxy: "loopback" });
    const { statuses } = await tryWrongPasswords(server.agent(), 4);
    expect(statuses).toEqual([401, 401, 401, 401]);
  });

  it("keeps the counters in PostgreSQL, so two API processes share one limit", async () => {
    const one = await startTestServer({ authRateLimit: 5 });
    const two = await startTestServer({ authRateLimit: 5 });
    const attempt = (s: typeof one) => s.agent().post("/api/auth/sign-in").send({ email: uniqueEmail("ghost"), password: "wrong password!!" });
    const statuses: number[] = [];
    for (const s of [one, two, one, two, one, two]) statuses.push((await attempt(s)).status);
    expect(statuses).toEqual([401, 401, 401, 401, 401, 429]);
    const rows = await db("auth_rate_limits").where("key", "like", "auth:5:%").select("key", "points");
    expect(rows).toEqual([{ key: expect.stringMatching(/127\.0\.0\.1$/), points: 6 }]);
  });

  it("reads TRUST_PROXY from the environment and refuses a value it cannot understand", () => {
    const base = { DATABASE_URL: "postgres://u@127.0.0.1:5432/x" };
    expect(loadEnv(base).trustProxy).toBe(false);
    expect(loadEnv({ ...base, TRUST_PROXY: "2" }).trustProxy).toBe(2);
    expect(loadEnv({ ...base, TRUST_PROXY: "loopback, 10.0.0.0/8" }).trustProxy).toBe("loopback, 10.0.0.0/8");
    expect(() => loadEnv({ ...base, TRUST_PROXY: "any proxy please!" })).toThrow(/TRUST_PROXY/);
  });
});

describe("session pool when PostgreSQL drops its connections", () => {
  it("survives an idle connection being cut and serves the next request", async () => {
    const server = await startTestServer();
    const founder = await signUpFounder(server);
    const { rows } = await pgPool.query<{ pid: number }>("select pg_backend_pid() as pid");
    const open = pgPool.totalCount;
    // What a PostgreSQL restart does to each connection (PostgreSQL 15 manual §9.27.2,
    // pg_terminate_backend). The pool then emits "error" for the idle client: with no listener of
    // the app's own, Node would end the process (this test file's run fails as an uncaught error).
    await db.raw("select pg_terminate_backend(?)", [rows[0]!.pid]);
    for (let waited = 0; pgPool.totalCount >= open; waited += 50) {
      if (waited > 10_000) throw new Error("the pool did not notice the cut connection within 10 s");
      await new Promise((r) => setTimeout(r, 50));
    }
    const me = await founder.agent.get("/api/auth/session");
    expect(me.status).toBe(200);
    expect(JSON.stringify(me.body.me)).toContain(founder.email);
  }, 20_000);
});
