import { createInvitationInputSchema } from "@tagloom/contracts";
import { Router } from "express";
import { requireSession } from "@/auth/session.middleware";
import { isUuid } from "@/db/types";
import { NotFoundError } from "@/errors";
import { actorOf, allow, memberOf } from "@/orgs/org-access";
import { acceptInvitation, createInvitation, listInvitations, previewInvitation, resendInvitation, revokeInvitation } from "./invitations.service";
import { idParams, noBody, noQuery, validate, validated } from "@/security/route-meta";

/** Admin routes below /orgs/:orgId. */
export const invitationsRouter = Router({ mergeParams: true });

invitationsRouter.get("/invitations", allow(), validate({ query: noQuery }), async (req, res) => {
  res.json({ items: await listInvitations(memberOf(req).organizationId), nextCursor: null });
});

invitationsRouter.post("/invitations", allow(), validate({ query: noQuery, body: createInvitationInputSchema }), async (req, res) => {
  const input = validated(req, "body", createInvitationInputSchema);
  res.status(201).json(await createInvitation(memberOf(req).organizationId, input, actorOf(req)));
});

function invitationId(raw: unknown): string {
  if (!isUuid(raw)) throw new NotFoundError("invitation");
  return raw;
}

invitationsRouter.post("/invitations/:invitationId/resend", allow(), validate({ params: idParams("invitationId"), query: noQuery, body: noBody }), async (req, res) => {
  res.json(await resendInvitation(memberOf(req).organizationId, invitationId(req.params.invitationId), actorOf(req)));
});

invitationsRouter.delete("/invitations/:invitationId", allow(), validate({ params: idParams("invitationId"), query: noQuery, body: noBody }), async (req, res) => {
  await revokeInvitation(memberOf(req).organizationId, invitationId(req.params.invitationId), actorOf(req));
  res.status(204).end();
});

/** The invitee's routes: see an invitation by its link token, accept it when signed in. */
export const invitationLinkRouter = Router();

invitationLinkRouter.get("/invitations/:token", validate({ params: idParams("token"), query: noQuery }), async (req, res) => {
  res.json(await previewInvitation(String(req.params.token)));
});

invitationLinkRouter.post("/invitations/:token/accept", requireSession, validate({ params: idParams("token"), query: noQuery, body: noBody }), async (req, res) => {
  res.json(await acceptInvitation(String(req.params.token), actorOf(req)));
});
