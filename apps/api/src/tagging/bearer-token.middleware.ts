import type { RequestHandler } from "express";
import { authenticateApiToken } from "@/api-tokens/api-tokens.service";
import { UnauthorizedError } from "@/errors";
import { withMeta } from "@/security/route-meta";

const reasons = {
  malformed: "The API token is malformed; tokens start with tgl_ and are shown once when created.",
  unknown: "The API token is not valid.",
  revoked: "The API token was revoked; ask a data lead or admin for a new one.",
} as const;

/**
 * Authenticates /api/v1 requests by `Authorization: Bearer <token>` only. A session cookie is
 * ignored on purpose: pipelines use tokens, and a cookie here would make these routes reachable
 * from any page a signed-in member visits.
 */
export const requireApiToken: RequestHandler = withMeta(async (req, res, next) => {
  const header = req.get("authorization");
  res.setHeader("WWW-Authenticate", 'Bearer realm="tagloom"');
  if (!header) throw new UnauthorizedError("Send the organization's API token as Authorization: Bearer <token>.");
  const match = /^Bearer ([^\s]+)$/i.exec(header.trim());
  if (!match) throw new UnauthorizedError("The Authorization header must read: Bearer <token>.");
  const found = await authenticateApiToken(match[1]!);
  if (typeof found === "string") throw new UnauthorizedError(reasons[found]);
  res.removeHeader("WWW-Authenticate");
  req.apiToken = { id: found.id, organizationId: found.organizationId, name: found.name };
  next();
}, { auth: "token" });
