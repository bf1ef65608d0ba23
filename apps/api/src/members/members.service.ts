import { decodePageCursor, encodePageCursor } from "@/corpora/page-cursor";
import type { Member, Page, Role } from "@tagloom/contracts";
import { type Actor, recordAudit } from "@/audit/audit.service";
import { endUserSessions, rotateUserSessions } from "@/auth/sessions.service";
import { db as defaultDb } from "@/db/knex";
import { type Db, iso } from "@/db/types";
import { ConflictError, NotFoundError } from "@/errors";
import {
  type MembershipRow,
  deleteMembership,
  findMembership,
  insertMembership,
  listMembers,
  listMembersByIds,
  listMembershipsOfUser,
  lockAdminIds,
  updateMembershipRole,
} from "./members.repository";

export type { MembershipRow };

export function listMembershipsForUser(userId: string, db?: Db): Promise<MembershipRow[]> {
  return listMembershipsOfUser(userId, db);
}

export function getMembership(organizationId: string, userId: string, db?: Db): Promise<MembershipRow | null> {
  return findMembership(organizationId, userId, db);
}

export function addMember(organizationId: string, userId: string, role: Role, db?: Db): Promise<void> {
  return insertMembership(organizationId, userId, role, db);
}

/** Members of the organization among the given user ids (for features that check assignees). */
export function getMembersByIds(organizationId: string, userIds: string[], db?: Db): Promise<MembershipRow[]> {
  return listMembersByIds(organizationId, userIds, db);
}

const toMember = (m: MembershipRow): Member => ({ userId: m.userId, name: m.name, email: m.email, role: m.role, joinedAt: iso(m.createdAt)! });

function decodeCursor(cursor: string | undefined): { name: string; userId: string } | undefined {
  const c = decodePageCursor(cursor, "text", "text");
  return c ? { name: String(c.value), userId: c.id } : undefined;
}

export async function getMembersPage(organizationId: string, page: { cursor?: string | undefined; limit: number }): Promise<Page<Member>> {
  const rows = await listMembers(organizationId, { limit: page.limit + 1, after: decodeCursor(page.cursor) });
  const more = rows.length > page.limit;
  const items = (more ? rows.slice(0, page.limit) : rows).map(toMember);
  const last = items[items.length - 1];
  return { items, nextCursor: more && last ? encodePageCursor(last.name, last.userId) : null };
}

async function assertNotLastAdmin(organizationId: string, userId: string, trx: Db): Promise<void> {
  const admins = await lockAdminIds(organizationId, trx);
  if (admins.length === 1 && admins[0] === userId) {
    throw new ConflictError("An organization needs at least one admin. Make another member an admin first.", null, "last_admin");
  }
}

export async function changeMemberRole(organizationId: string, userId: string, role: Role, actor: Actor): Promise<Member> {
  return defaultDb.transaction(async (trx) => {
    const current = await findMembership(organizationId, userId, trx);
    if (!current) throw new NotFoundError("member");
    if (current.role === role) return toMember(current);
    if (current.role === "admin") await assertNotLastAdmin(organizationId, userId, trx);
    await updateMembershipRole(organizationId, userId, role, trx);
    await rotateUserSessions(userId, trx);
    await recordAudit(trx, actor, organizationId, "member.role_changed", { type: "user", id: userId, label: current.email }, { from: current.role, to: role });
    return toMember({ ...current, role });
  });
}

export async function removeMember(organizationId: string, userId: string, actor: Actor): Promise<void> {
  await defaultDb.transaction(async (trx) => {
    const current = await findMembership(organizationId, userId, trx);
    if (!current) throw new NotFoundError("member");
    if (current.role === "admin") await assertNotLastAdmin(organizationId, userId, trx);
    await deleteMembership(organizationId, userId, trx);
    await endUserSessions(userId, trx);
    await recordAudit(trx, actor, organizationId, "member.removed", { type: "user", id: userId, label: current.email }, { role: current.role });
  });
}
