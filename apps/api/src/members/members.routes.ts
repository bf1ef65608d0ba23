import { pageQuerySchema, updateMemberInputSchema } from "@tagloom/contracts";
import { Router } from "express";
import { parseOrThrow } from "@/errors";
import { actorOf, allow, anyMember, memberOf } from "@/orgs/org-access";
import { changeMemberRole, getMembersPage, removeMember } from "./members.service";

export const membersRouter = Router({ mergeParams: true });

// Every member may see who else is in the organization (managers pick assignees from it).
membersRouter.get("/members", anyMember, async (req, res) => {
  const page = parseOrThrow(pageQuerySchema, req.query, "query");
  res.json(await getMembersPage(memberOf(req).organizationId, page));
});

membersRouter.patch("/members/:userId", allow(), async (req, res) => {
  const { role } = parseOrThrow(updateMemberInputSchema, req.body);
  res.json(await changeMemberRole(memberOf(req).organizationId, String(req.params.userId), role, actorOf(req)));
});

membersRouter.delete("/members/:userId", allow(), async (req, res) => {
  await removeMember(memberOf(req).organizationId, String(req.params.userId), actorOf(req));
  res.status(204).end();
});
