import { createApiTokenInputSchema } from "@tagloom/contracts";
import { Router } from "express";
import { actorOf, allow, memberOf } from "@/orgs/org-access";
import { createApiToken, listApiTokens, revokeApiToken } from "./api-tokens.service";
import { idParams, noBody, noQuery, validate, validated } from "@/security/route-meta";

/** Data lead and admin routes below /orgs/:orgId. */
export const apiTokensRouter = Router({ mergeParams: true });

apiTokensRouter.get("/tokens", allow("data_lead"), validate({ query: noQuery }), async (req, res) => {
  res.json({ items: await listApiTokens(memberOf(req).organizationId), nextCursor: null });
});

apiTokensRouter.post("/tokens", allow("data_lead"), validate({ query: noQuery, body: createApiTokenInputSchema }), async (req, res) => {
  const input = validated(req, "body", createApiTokenInputSchema);
  res.setHeader("Cache-Control", "no-store");
  res.status(201).json(await createApiToken(memberOf(req).organizationId, input, actorOf(req)));
});

apiTokensRouter.delete("/tokens/:tokenId", allow("data_lead"), validate({ params: idParams("tokenId"), query: noQuery, body: noBody }), async (req, res) => {
  await revokeApiToken(memberOf(req).organizationId, String(req.params.tokenId), actorOf(req));
  res.status(204).end();
});
