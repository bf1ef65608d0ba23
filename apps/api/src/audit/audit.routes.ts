import { auditQuerySchema } from "@tagloom/contracts";
import { Router } from "express";
import { allow, memberOf } from "@/orgs/org-access";
import { getAuditPage } from "./audit.service";
import { validate, validated } from "@/security/route-meta";

export const auditRouter = Router({ mergeParams: true });

auditRouter.get("/audit", allow(), validate({ query: auditQuerySchema }), async (req, res) => {
  const query = validated(req, "query", auditQuerySchema);
  res.json(await getAuditPage(memberOf(req).organizationId, query));
});
