import type { Role } from "@tagloom/contracts";
import { beforeAll, describe, expect, it } from "vitest";
import { type TestServer, startTestServer } from "./support/http";
import { allowedStatusFor, routeCatalog, withUnknownId } from "./support/route-catalog";
import { type TenantFixture, buildTenantFixture, tenantFingerprint } from "./support/tenant-fixture";
import "./support/feature-fixtures";

let server: TestServer;
let a: TenantFixture;
let b: TenantFixture;

beforeAll(async () => {
  server = await startTestServer();
  a = await buildTenantFixture(server, "Tenant A");
  b = await buildTenantFixture(server, "Tenant B");
}, 120_000);

const label = (r: (typeof routeCatalog)[number]) => `${r.method.toUpperCase()} ${r.path({ orgId: ":orgId", memberUserId: ":userId", invitationId: ":invitationId", ids: new Proxy({}, { get: (_t, k) => `:${String(k)}` }) } as unknown as TenantFixture)}`;

describe("cross-tenant matrix: a member of A using B's ids gets 404 and B is unchanged", () => {
  for (const route of routeCatalog) {
    it(label(route), async () => {
      const before = await tenantFingerprint(b.orgId);
      // A's admin can do everything in A; in B they are nobody.
      const res = await a.admin.agent[route.method](`/api${route.path(b)}`).send(route.body?.(b) as object);
      expect(res.status, JSON.stringify(res.body)).toBe(404);
      expect(JSON.stringify(res.body)).not.toContain("Tenant B");
      expect(await tenantFingerprint(b.orgId)).toEqual(before);
    });
  }
});

describe("role matrix: each route lets its roles through and answers 403 to the others", () => {
  const roleAgents = (f: TenantFixture): Record<Role, TenantFixture["admin"]> => ({
    admin: f.admin,
    manager: f.manager,
    data_lead: f.dataLead,
    annotator: f.annotator,
  });
  for (const route of routeCatalog) {
    for (const role of ["admin", "manager", "data_lead", "annotator"] as const) {
      const allowed = role === "admin" || route.roles.includes(role);
      const expected = allowed ? allowedStatusFor(route, role) : 403;
      it(`${label(route)} as ${role} → ${expected}`, async () => {
        const member = roleAgents(a)[role];
        const destructive = route.method === "delete" || route.method === "post" || route.method === "patch" || route.method === "put";
        // Allowed roles send the harmless probe; for routes without one, aim at an unknown id.
        let path = route.path(a);
        if (allowed && destructive && !route.probe) {
          for (const id of [a.invitationId, a.memberUserId, ...Object.values(a.ids)]) path = withUnknownId(path, id);
        }
        const body = allowed ? route.probe?.(a) : route.body?.(a) ?? route.probe?.(a);
        const before = allowed ? null : await tenantFingerprint(a.orgId);
        const res = await member.agent[route.method](`/api${path}`).send(body as object);
        // The exact status: "anything but 403" would let a 500 behind the guard pass.
        expect(res.status, JSON.stringify(res.body)).toBe(expected);
        if (allowed) {
          const code = ({ 400: "validation_failed", 404: "not_found" } as Record<number, string>)[expected];
          if (code) expect(res.body.error.code).toBe(code);
        } else {
          expect(res.body.error.code).toBe("forbidden");
          expect(await tenantFingerprint(a.orgId)).toEqual(before);
        }
      });
    }
  }
});
