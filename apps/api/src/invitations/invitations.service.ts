import { type Invitation, type InvitationPreview, type InvitationStatus, type Role, roleLabels } from "@tagloom/contracts";
import type { Knex } from "knex";
import { type Actor, recordAudit } from "@/audit/audit.service";
import { createLinkToken, hashLinkToken } from "@/auth/tokens";
import { reserveSeat } from "@/billing/billing.service";
import { getUserByEmail as findUserByEmail } from "@/auth/users.service";
import { env } from "@/config/env";
import { db } from "@/db/knex";
import { type Db, iso } from "@/db/types";
import { AppError, ConflictError, ForbiddenError, NotFoundError } from "@/errors";
import { dispatchEmails, queueEmail } from "@/mail/mail.service";
import { composeEmail } from "@/mail/templates";
import { addMember, getMembership } from "@/members/members.service";
import {
  type InvitationRow,
  findInvitation,
  findInvitationByTokenHash,
  findPendingInvitationForEmail,
  insertInvitation,
  listInvitationsOfOrganization,
  markInvitationAccepted,
  markInvitationRevoked,
  replaceInvitationToken,
} from "./invitations.repository";

const INVITATION_TTL_MS = 7 * 24 * 60 * 60 * 1000;

export class InvitationNotUsableError extends AppError {
  constructor(status: InvitationStatus) {
    const why = {
      accepted: "it has already been used",
      revoked: "it was withdrawn by an admin",
      expired: "it has expired; ask an admin to send it again",
      pending: "",
    }[status];
    super(410, "invitation_unusable", `This invitation cannot be used: ${why}.`, { status });
  }
}

function statusOf(i: InvitationRow, now = Date.now()): InvitationStatus {
  if (i.acceptedAt) return "accepted";
  if (i.revokedAt) return "revoked";
  if (i.expiresAt.getTime() <= now) return "expired";
  return "pending";
}

const toInvitation = (i: InvitationRow): Invitation => ({
  id: i.id,
  email: i.email,
  role: i.role,
  status: statusOf(i),
  invitedBy: i.invitedBy,
  expiresAt: iso(i.expiresAt)!,
  lastSentAt: iso(i.lastSentAt)!,
  sendCount: i.sendCount,
  createdAt: iso(i.createdAt)!,
});

function invitationEmail(i: { organizationName: string; role: Role }, inviter: string, token: string) {
  return composeEmail(
    `You are invited to ${i.organizationName} on Tagloom`,
    [
      `${inviter} invited you to join ${i.organizationName} on Tagloom as ${roleLabels[i.role].toLowerCase()}.`,
      "Open the link to accept. If you have no Tagloom account yet you can create one there. The link works once and expires in 7 days.",
    ],
    { label: "Accept the invitation", url: `${env.publicUrl}/invitations/${encodeURIComponent(token)}` },
    "If you did not expect this invitation, you can ignore this message.",
  );
}

export async function listInvitations(organizationId: string): Promise<Invitation[]> {
  return (await listInvitationsOfOrganization(organizationId)).map(toInvitation);
}

export async function createInvitation(organizationId: string, input: { email: string; role: Role }, actor: Actor & { userId: string; name: string }): Promise<Invitation> {
  const { invitation, emailId } = await db.transaction(async (trx) => {
    const existingUser = await findUserByEmail(input.email, trx);
    if (existingUser && (await getMembership(organizationId, existingUser.id, trx))) {
      throw new ConflictError(`${input.email} is already a member of this organization.`, { fields: { email: ["Already a member."] } }, "already_member");
    }
    const pending = await findPendingInvitationForEmail(organizationId, input.email, trx);
    if (pending && statusOf(pending) === "pending") {
      throw new ConflictError(`${input.email} already has a pending invitation. Resend it instead.`, { invitationId: pending.id }, "invitation_pending");
    }
    // An expired invitation that was never accepted or withdrawn gives way to the new one.
    if (pending) await markInvitationRevoked(pending.id, trx);
    // Every pending invitation holds a seat (402 when none is free).
    await reserveSeat(organizationId, trx);
    const { token, hash } = createLinkToken();
    const id = await insertInvitation(
      { organizationId, email: input.email, role: input.role, tokenHash: hash, invitedBy: actor.userId, expiresAt: new Date(Date.now() + INVITATION_TTL_MS) },
      trx,
    );
    const row = (await findInvitation(organizationId, id, trx))!;
    const emailId = await queueEmail(trx, { to: input.email, organizationId, kind: "invitation", content: invitationEmail(row, actor.name, token) });
    await recordAudit(trx, actor, organizationId, "invitation.created", { type: "invitation", id, label: input.email }, { role: input.role });
    return { invitation: toInvitation(row), emailId };
  });
  await dispatchEmails([emailId]);
  return invitation;
}

/** Sends a pending or expired invitation again with a new link (the old link stops working). */
export async function resendInvitation(organizationId: string, invitationId: string, actor: Actor & { name: string }): Promise<Invitation> {
  const { invitation, emailId } = await db.transaction(async (trx) => {
    const row = await findInvitation(organizationId, invitationId, trx, true);
    if (!row) throw new NotFoundError("invitation");
    const status = statusOf(row);
    if (status === "accepted" || status === "revoked") throw new InvitationNotUsableError(status);
    // An expired invitation held no seat; sending it again takes one.
    if (status === "expired") await reserveSeat(organizationId, trx);
    const { token, hash } = createLinkToken();
    await replaceInvitationToken(row.id, hash, new Date(Date.now() + INVITATION_TTL_MS), trx);
    const fresh = (await findInvitation(organizationId, invitationId, trx))!;
    const emailId = await queueEmail(trx, { to: row.email, organizationId, kind: "invitation", content: invitationEmail(row, actor.name, token) });
    await recordAudit(trx, actor, organizationId, "invitation.resent", { type: "invitation", id: row.id, label: row.email });
    return { invitation: toInvitation(fresh), emailId };
  });
  await dispatchEmails([emailId]);
  return invitation;
}

export async function revokeInvitation(organizationId: string, invitationId: string, actor: Actor): Promise<void> {
  await db.transaction(async (trx) => {
    const row = await findInvitation(organizationId, invitationId, trx, true);
    if (!row) throw new NotFoundError("invitation");
    const status = statusOf(row);
    if (status === "accepted" || status === "revoked") throw new InvitationNotUsableError(status);
    await markInvitationRevoked(row.id, trx);
    await recordAudit(trx, actor, organizationId, "invitation.revoked", { type: "invitation", id: row.id, label: row.email });
  });
}

/** What the invitation page shows; 404 for an unknown token. */
export async function previewInvitation(token: string): Promise<InvitationPreview> {
  const row = await findInvitationByTokenHash(hashLinkToken(token));
  if (!row) throw new NotFoundError("invitation");
  return {
    organizationName: row.organizationName,
    email: row.email,
    role: row.role,
    invitedBy: row.invitedBy,
    status: statusOf(row),
    accountExists: (await findUserByEmail(row.email)) !== null,
  };
}

/** The pending invitation of a token, locked when asked; otherwise a 404 or 410 saying why. */
export async function findPendingInvitationByToken(token: string, trx: Db, { lock = false } = {}): Promise<InvitationRow> {
  const row = await findInvitationByTokenHash(hashLinkToken(token), trx, lock);
  if (!row) throw new NotFoundError("invitation");
  const status = statusOf(row);
  if (status !== "pending") throw new InvitationNotUsableError(status);
  return row;
}

export async function acceptInvitationForNewUser(
  invitation: InvitationRow,
  user: { id: string; email: string },
  ip: string | null,
  trx: Knex.Transaction,
): Promise<void> {
  await addMember(invitation.organizationId, user.id, invitation.role, trx);
  await markInvitationAccepted(invitation.id, user.id, trx);
  await recordAudit(trx, { userId: user.id, email: user.email, ip }, invitation.organizationId, "member.joined", { type: "user", id: user.id, label: user.email }, { role: invitation.role, invitationId: invitation.id });
}

/** A signed-in user accepts an invitation sent to their own address. */
export async function acceptInvitation(token: string, actor: Actor & { userId: string }): Promise<{ organizationId: string }> {
  return db.transaction(async (trx) => {
    const invitation = await findPendingInvitationByToken(token, trx, { lock: true });
    if (invitation.email !== actor.email) {
      throw new ForbiddenError(`This invitation was sent to ${invitation.email}; you are signed in as ${actor.email}. Sign in with the invited address.`);
    }
    if (await getMembership(invitation.organizationId, actor.userId, trx)) {
      await markInvitationAccepted(invitation.id, actor.userId, trx);
      return { organizationId: invitation.organizationId };
    }
    await acceptInvitationForNewUser(invitation, { id: actor.userId, email: actor.email }, actor.ip ?? null, trx);
    return { organizationId: invitation.organizationId };
  });
}
