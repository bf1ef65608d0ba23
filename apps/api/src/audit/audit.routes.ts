import { auditQuerySchema } from "@tagloom/contracts";
import { Router } from "express";
import { parseOrThrow } from "@/errors";
import { allow, memberOf } from "@/orgs/org-access";
import { getAuditPage } from "./audit.service";
import { validate } from "@/security/route-meta";

export const auditRouter = Router({ mergeParams: true });

auditRouter.get("/audit", allow(), validate({ query: auditQuerySchema }), async (req, res) => {
  const query = parseOrThrow(auditQuerySchema, req.query, "query");
  res.json(await getAuditPage(memberOf(req).organizationId, query));
});
