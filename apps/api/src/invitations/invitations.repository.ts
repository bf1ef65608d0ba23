import type { Role } from "@tagloom/contracts";
import { db as defaultDb } from "@/db/knex";
import type { Db } from "@/db/types";

export type InvitationRow = {
  id: string;
  organizationId: string;
  organizationName: string;
  email: string;
  role: Role;
  invitedBy: string | null;
  expiresAt: Date;
  acceptedAt: Date | null;
  revokedAt: Date | null;
  lastSentAt: Date;
  sendCount: number;
  createdAt: Date;
};

function base(db: Db) {
  return db("invitations as i")
    .join("organizations as o", "o.id", "i.organization_id")
    .leftJoin("auth_user as u", "u.id", "i.invited_by")
    .select("i.*", "o.name as organization_name", "u.name as inviter_name", "u.email as inviter_email");
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
const toRow = (r: any): InvitationRow => ({
  id: r.id,
  organizationId: r.organization_id,
  organizationName: r.organization_name,
  email: r.email,
  role: r.role,
  invitedBy: r.inviter_name ? `${r.inviter_name} <${r.inviter_email}>` : null,
  expiresAt: r.expires_at,
  acceptedAt: r.accepted_at,
  revokedAt: r.revoked_at,
  lastSentAt: r.last_sent_at,
  sendCount: r.send_count,
  createdAt: r.created_at,
});

export async function insertInvitation(
  i: { organizationId: string; email: string; role: Role; tokenHash: string; invitedBy: string; expiresAt: Date },
  db: Db = defaultDb,
): Promise<string> {
  const [row] = await db("invitations")
    .insert({ organization_id: i.organizationId, email: i.email, role: i.role, token_hash: i.tokenHash, invited_by: i.invitedBy, expires_at: i.expiresAt })
    .returning("id");
  return row.id as string;
}

export async function listInvitationsOfOrganization(organizationId: string, db: Db = defaultDb): Promise<InvitationRow[]> {
  const rows = await base(db).where("i.organization_id", organizationId).orderBy("i.created_at", "desc").limit(500);
  return rows.map(toRow);
}

export async function findInvitation(organizationId: string, id: string, db: Db = defaultDb, lock = false): Promise<InvitationRow | null> {
  const q = base(db).where({ "i.organization_id": organizationId, "i.id": id });
  if (lock) q.forUpdate("i");
  const r = await q.first();
  return r ? toRow(r) : null;
}

export async function findInvitationByTokenHash(tokenHash: string, db: Db = defaultDb, lock = false): Promise<InvitationRow | null> {
  const q = base(db).where("i.token_hash", tokenHash);
  if (lock) q.forUpdate("i");
  const r = await q.first();
  return r ? toRow(r) : null;
}

export async function findPendingInvitationForEmail(organizationId: string, email: string, db: Db = defaultDb): Promise<InvitationRow | null> {
  const r = await base(db)
    .where({ "i.organization_id": organizationId, "i.email": email })
    .whereNull("i.accepted_at")
    .whereNull("i.revoked_at")
    .first();
  return r ? toRow(r) : null;
}

export async function replaceInvitationToken(id: string, tokenHash: string, expiresAt: Date, db: Db = defaultDb): Promise<void> {
  await db("invitations")
    .where({ id })
    .update({ token_hash: tokenHash, expires_at: expiresAt, last_sent_at: db.fn.now(), send_count: db.raw("send_count + 1") });
}

export async function markInvitationRevoked(id: string, db: Db = defaultDb): Promise<void> {
  await db("invitations").where({ id }).update({ revoked_at: db.fn.now() });
}

export async function markInvitationAccepted(id: string, userId: string, db: Db = defaultDb): Promise<void> {
  await db("invitations").where({ id }).update({ accepted_at: db.fn.now(), accepted_by: userId });
}
