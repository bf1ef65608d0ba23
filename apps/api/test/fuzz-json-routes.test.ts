import fc from "fast-check";
import { beforeAll, describe, expect, it } from "vitest";
import { type TestServer, startTestServer } from "./support/http";
import { routeCatalog } from "./support/route-catalog";
import { type TenantFixture, buildTenantFixture, tenantFingerprint } from "./support/tenant-fixture";
import "./support/feature-fixtures";

// Bounded and seeded: FUZZ_SEED replays a run; fast-check prints the seed and the shrunk
// counterexample when the property fails.
const SEED = Number(process.env.FUZZ_SEED ?? 20261203);
const RUNS = 150;

let server: TestServer;
let f: TenantFixture;

beforeAll(async () => {
  server = await startTestServer();
  f = await buildTenantFixture(server, "Fuzz Tenant");
}, 120_000);

/** Values people and scripts send by mistake: wrong types, huge numbers, NUL and control characters, lone surrogates, bidi controls, long text. */
const odd = fc.oneof(
  fc.string({ maxLength: 20 }),
  fc.constantFrom("", "\u0000", "a\u0000b", "\ud800", "x\udfffy", "\u202e", "\u0007\u001b[2J", "x".repeat(5000), "  ", "<script>", "' OR 1=1 --"),
  fc.integer(),
  fc.double(),
  fc.constantFrom(1e308, -1e308, 2 ** 31, 2 ** 53 + 2, 1e20, -1, 0),
  fc.boolean(),
  fc.constant(null),
);
const keys = fc.oneof(fc.string({ maxLength: 8 }), fc.constantFrom("name", "email", "role", "spans", "documentIds", "description", "guideline", "version", "config", "__proto__", "constructor"));
const { json } = fc.letrec((tie) => ({
  json: fc.oneof({ depthSize: "small" }, odd, fc.array(tie("json"), { maxLength: 4 }), fc.dictionary(keys, tie("json"), { maxKeys: 5 })),
}));
const deep = fc.integer({ min: 30, max: 200 }).map((n) => JSON.parse(`${"[".repeat(n)}1${"]".repeat(n)}`) as unknown);

const writes = () => routeCatalog.filter((r) => r.method === "post" || r.method === "put" || r.method === "patch");
const reads = () => routeCatalog.filter((r) => r.method === "get");

describe("fuzz pass over the JSON routes", () => {
  it("never answers 5xx to odd bodies, and a refused request changes nothing", async () => {
    const routes = writes();
    expect(routes.length).toBeGreaterThan(20);
    // A body: something arbitrary, or the route's own good body with one field replaced or added.
    const body = fc.oneof(
      json,
      deep,
      fc.tuple(fc.nat(), keys, json).map(([i, key, value]) => ({ i, key, value })),
    );
    await fc.assert(
      fc.asyncProperty(fc.nat({ max: routes.length - 1 }), body, async (index, sent) => {
        const route = routes[index]!;
        let payload: unknown = sent;
        if (sent && typeof sent === "object" && "i" in sent && "key" in sent) {
          const { key, value } = sent as unknown as { key: string; value: unknown };
          const good = route.body?.(f) ?? route.probe?.(f) ?? {};
          payload = typeof good === "object" && good !== null ? { ...good, [key]: value } : { [key]: value };
        }
        const before = await tenantFingerprint(f.orgId);
        const res = await f.admin.agent[route.method](`/api${route.path(f)}`).set("Content-Type", "application/json").send(JSON.stringify(payload) ?? "null");
        expect(res.status, `${route.method} ${route.path(f)} ${JSON.stringify(payload).slice(0, 300)} → ${JSON.stringify(res.body).slice(0, 300)}`).toBeLessThan(500);
        if (res.status >= 400) expect(await tenantFingerprint(f.orgId), `${route.method} ${route.path(f)} refused but changed`).toEqual(before);
      }),
      { numRuns: RUNS, seed: SEED, endOnFailure: true },
    );
  }, 300_000);

  it("never answers 5xx to odd query strings on the lists", async () => {
    const routes = reads();
    const query = fc.dictionary(fc.constantFrom("cursor", "limit", "q", "sort", "dir", "state", "split", "format", "action", "actor", "from", "to", "x"), odd.map((v) => String(v)), { maxKeys: 4 });
    await fc.assert(
      fc.asyncProperty(fc.nat({ max: routes.length - 1 }), query, async (index, q) => {
        const route = routes[index]!;
        const path = `/api${route.path(f)}`.replace(/\?.*$/, "");
        const res = await f.admin.agent.get(path).query(q);
        expect(res.status, `GET ${path} ${JSON.stringify(q).slice(0, 300)} → ${JSON.stringify(res.body).slice(0, 300)}`).toBeLessThan(500);
      }),
      { numRuns: RUNS, seed: SEED, endOnFailure: true },
    );
  }, 300_000);
});
