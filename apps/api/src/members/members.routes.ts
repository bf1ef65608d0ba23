import { pageQuerySchema, updateMemberInputSchema } from "@tagloom/contracts";
import { Router } from "express";
import { actorOf, allow, anyMember, memberOf } from "@/orgs/org-access";
import { changeMemberRole, getMembersPage, removeMember } from "./members.service";
import { idParams, noBody, noQuery, validate, validated } from "@/security/route-meta";

export const membersRouter = Router({ mergeParams: true });

// Every member may see who else is in the organization (managers pick assignees from it).
membersRouter.get("/members", anyMember, validate({ query: pageQuerySchema }), async (req, res) => {
  const page = validated(req, "query", pageQuerySchema);
  res.json(await getMembersPage(memberOf(req).organizationId, page));
});

membersRouter.patch("/members/:userId", allow(), validate({ params: idParams("userId"), query: noQuery, body: updateMemberInputSchema }), async (req, res) => {
  const { role } = validated(req, "body", updateMemberInputSchema);
  res.json(await changeMemberRole(memberOf(req).organizationId, String(req.params.userId), role, actorOf(req)));
});

membersRouter.delete("/members/:userId", allow(), validate({ params: idParams("userId"), query: noQuery, body: noBody }), async (req, res) => {
  await removeMember(memberOf(req).organizationId, String(req.params.userId), actorOf(req));
  res.status(204).end();
});
