import { createOrganizationInputSchema, deleteOrganizationInputSchema, renameOrganizationInputSchema } from "@tagloom/contracts";
import { Router } from "express";
import { requireSession } from "@/auth/session.middleware";
import { actorOf, allow, anyMember, memberOf } from "./org-access";
import { createOrganization, deleteOrganizationForGood, getOrganization, renameOrganizationAs } from "./orgs.service";
import { bodyOrEmpty, noQuery, validate, validated } from "@/security/route-meta";

/** POST /orgs (any signed-in user founds an organization). */
export const orgsRouter = Router();
orgsRouter.post("/orgs", requireSession, validate({ query: noQuery, body: createOrganizationInputSchema }), async (req, res) => {
  const { name } = validated(req, "body", createOrganizationInputSchema);
  const org = await createOrganization(name, actorOf(req));
  res.status(201).json({ id: org.id, name: org.name, role: "admin" });
});

/** Routes on the organization itself, mounted below /orgs/:orgId. */
export const orgRouter = Router({ mergeParams: true });
orgRouter.get("/", anyMember, validate({ query: noQuery }), async (req, res) => {
  const m = memberOf(req);
  const org = await getOrganization(m.organizationId);
  res.json({ id: org.id, name: org.name, role: m.role });
});
orgRouter.patch("/", allow(), validate({ query: noQuery, body: renameOrganizationInputSchema }), async (req, res) => {
  const { name } = validated(req, "body", renameOrganizationInputSchema);
  const org = await renameOrganizationAs(memberOf(req).organizationId, name, actorOf(req));
  res.json({ id: org.id, name: org.name, role: memberOf(req).role });
});
const deleteOrganizationBody = bodyOrEmpty(deleteOrganizationInputSchema);
orgRouter.delete("/", allow(), validate({ query: noQuery, body: deleteOrganizationBody }), async (req, res) => {
  const { confirmName } = validated(req, "body", deleteOrganizationBody);
  await deleteOrganizationForGood(memberOf(req).organizationId, confirmName, actorOf(req));
  res.status(204).end();
});
