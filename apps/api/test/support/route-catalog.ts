import type { Role } from "@tagloom/contracts";
import type { TenantFixture } from "./tenant-fixture";

export type CatalogRoute = {
  method: "get" | "post" | "put" | "patch" | "delete";
  /** Path under /api with :orgId and other :params filled from the fixture by `path(f)`. */
  path: (f: TenantFixture) => string;
  /** Roles the route lets through (admin is always allowed). */
  roles: readonly Role[];
  /**
   * A body that would succeed if the caller were allowed, used against the other organization
   * (which must answer 404 and change nothing).
   */
  body?: (f: TenantFixture) => unknown;
  /**
   * A body for the role matrix. It must not destroy the fixture when the role is allowed
   * (e.g. an invalid body answering 400 or an unknown id answering 404): the matrix only checks
   * that allowed roles get past the role guard and the others get 403.
   */
  probe?: (f: TenantFixture) => unknown;
};

const ALL: readonly Role[] = ["admin", "manager", "data_lead", "annotator"];
const ADMIN: readonly Role[] = ["admin"];
const NO_SUCH_ID = "00000000-0000-4000-8000-000000000000";

/** Every tenant route. Each feature adds its routes here; tenancy.test.ts runs them all. */
export const routeCatalog: CatalogRoute[] = [
  { method: "get", path: (f) => `/orgs/${f.orgId}`, roles: ALL },
  { method: "patch", path: (f) => `/orgs/${f.orgId}`, roles: ADMIN, body: () => ({ name: "Renamed By Intruder" }), probe: () => ({ name: "" }) },
  { method: "delete", path: (f) => `/orgs/${f.orgId}`, roles: ADMIN, body: () => ({ confirmName: "Tenant B" }), probe: () => ({ confirmName: "not the name" }) },
  { method: "get", path: (f) => `/orgs/${f.orgId}/members`, roles: ALL },
  {
    method: "patch",
    path: (f) => `/orgs/${f.orgId}/members/${f.memberUserId}`,
    roles: ADMIN,
    body: () => ({ role: "admin" }),
    probe: () => ({ role: "not-a-role" }),
  },
  { method: "delete", path: (f) => `/orgs/${f.orgId}/members/${f.memberUserId}`, roles: ADMIN, probe: () => undefined },
  { method: "get", path: (f) => `/orgs/${f.orgId}/invitations`, roles: ADMIN },
  {
    method: "post",
    path: (f) => `/orgs/${f.orgId}/invitations`,
    roles: ADMIN,
    body: () => ({ email: "intruder-invite@example.test", role: "admin" }),
    probe: () => ({ email: "not an address", role: "annotator" }),
  },
  { method: "post", path: (f) => `/orgs/${f.orgId}/invitations/${f.invitationId}/resend`, roles: ADMIN },
  { method: "delete", path: (f) => `/orgs/${f.orgId}/invitations/${f.invitationId}`, roles: ADMIN },
  { method: "get", path: (f) => `/orgs/${f.orgId}/audit`, roles: ADMIN },
];

/** For routes whose probe must not act on the fixture's real object. */
export function withUnknownId(path: string, realId: string): string {
  return path.replace(realId, NO_SUCH_ID);
}
