import type { Role } from "@tagloom/contracts";
import type { Request, RequestHandler } from "express";
import type { Actor } from "@/audit/audit.service";
import { isUuid } from "@/db/types";
import { ForbiddenError, NotFoundError, UnauthorizedError } from "@/errors";
import { getMembership } from "@/members/members.service";
import { withMeta } from "@/security/route-meta";

/**
 * Loads the signed-in user's membership in the organization of the URL into req.member. A user
 * who is not a member gets 404, exactly as for an organization that does not exist.
 */
export const orgScope: RequestHandler = withMeta(async (req, _res, next) => {
  if (!req.auth) throw new UnauthorizedError();
  const orgId = req.params.orgId;
  if (!isUuid(orgId)) throw new NotFoundError("organization");
  const m = await getMembership(orgId, req.auth.userId);
  if (!m) throw new NotFoundError("organization");
  req.member = { organizationId: m.organizationId, userId: m.userId, role: m.role, email: m.email, name: m.name };
  next();
}, { auth: "session" });

/** Lets the listed roles through (admins always); others get 403. Declare it on every org route. */
export function allow(...roles: Role[]): RequestHandler {
  const allowed = new Set<Role>(["admin", ...roles]);
  // The roles are attached to the guard so the route-table test can read them from the router.
  return withMeta((req, _res, next) => {
    if (!req.member) throw new UnauthorizedError();
    if (!allowed.has(req.member.role)) throw new ForbiddenError();
    next();
  }, { roles: [...allowed] });
}

/** Every role may use the route (still members only). */
export const anyMember = allow("manager", "data_lead", "annotator");

/**
 * A corpus's documents, gold spans and uploads: not annotators, who see documents only through
 * their own assignments (others' gold could bias their work). Matches `can(role, "viewCorpusData")`.
 */
export const viewCorpusData = allow("manager", "data_lead");

/** The member behind an org route, for services and the audit log. */
export function memberOf(req: Request): NonNullable<Request["member"]> {
  if (!req.member) throw new UnauthorizedError();
  return req.member;
}

export function actorOf(req: Request): Actor & { userId: string; name: string } {
  if (!req.auth) throw new UnauthorizedError();
  return { userId: req.auth.userId, email: req.auth.email, name: req.auth.name, ip: req.ip ?? null };
}
