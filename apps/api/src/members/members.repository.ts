import type { Role } from "@tagloom/contracts";
import { db as defaultDb } from "@/db/knex";
import type { Db } from "@/db/types";

export type MembershipRow = {
  organizationId: string;
  organizationName: string;
  userId: string;
  email: string;
  name: string;
  role: Role;
  createdAt: Date;
};

const columns = [
  "m.organization_id",
  "o.name as organization_name",
  "m.user_id",
  "u.email",
  "u.name",
  "m.role",
  "m.created_at",
];

function base(db: Db) {
  return db("memberships as m")
    .join("auth_user as u", "u.id", "m.user_id")
    .join("organizations as o", "o.id", "m.organization_id")
    .select(columns);
}

type Raw = {
  organization_id: string;
  organization_name: string;
  user_id: string;
  email: string;
  name: string;
  role: Role;
  created_at: Date;
};
const toRow = (r: Raw): MembershipRow => ({
  organizationId: r.organization_id,
  organizationName: r.organization_name,
  userId: r.user_id,
  email: r.email,
  name: r.name,
  role: r.role,
  createdAt: r.created_at,
});

export async function findMembership(organizationId: string, userId: string, db: Db = defaultDb): Promise<MembershipRow | null> {
  const r = await base(db).where({ "m.organization_id": organizationId, "m.user_id": userId }).first();
  return r ? toRow(r) : null;
}

export async function listMembershipsOfUser(userId: string, db: Db = defaultDb): Promise<MembershipRow[]> {
  const rows = await base(db).where({ "m.user_id": userId }).orderBy([{ column: "o.name" }, { column: "m.organization_id" }]);
  return rows.map(toRow);
}

/** A page of members ordered by name then user id; the cursor is the last row's `name\u0000userId`. */
export async function listMembers(
  organizationId: string,
  page: { limit: number; after?: { name: string; userId: string } | undefined },
  db: Db = defaultDb,
): Promise<MembershipRow[]> {
  const q = base(db).where({ "m.organization_id": organizationId });
  if (page.after) {
    const { name, userId } = page.after;
    q.andWhere((w) => w.where("u.name", ">", name).orWhere((x) => x.where("u.name", "=", name).andWhere("u.id", ">", userId)));
  }
  const rows = await q.orderBy([{ column: "u.name" }, { column: "u.id" }]).limit(page.limit);
  return rows.map(toRow);
}

export async function listMembersByIds(organizationId: string, userIds: string[], db: Db = defaultDb): Promise<MembershipRow[]> {
  if (!userIds.length) return [];
  const rows = await base(db).where({ "m.organization_id": organizationId }).whereIn("m.user_id", userIds);
  return rows.map(toRow);
}

export async function insertMembership(organizationId: string, userId: string, role: Role, db: Db = defaultDb): Promise<void> {
  await db("memberships").insert({ organization_id: organizationId, user_id: userId, role });
}

export async function updateMembershipRole(organizationId: string, userId: string, role: Role, db: Db = defaultDb): Promise<void> {
  await db("memberships").where({ organization_id: organizationId, user_id: userId }).update({ role });
}

export async function deleteMembership(organizationId: string, userId: string, db: Db = defaultDb): Promise<void> {
  await db("memberships").where({ organization_id: organizationId, user_id: userId }).delete();
}

/**
 * Locks the organization's admin memberships and returns their user ids, so that two concurrent
 * demotions cannot both pass the last-admin check.
 */
export async function lockAdminIds(organizationId: string, db: Db): Promise<string[]> {
  // Lock the organization row first: every admin-changing transaction of one organization then
  // queues behind the others instead of locking member rows in different orders (a deadlock).
  await db("organizations").where({ id: organizationId }).forUpdate().select("id");
  const rows = await db("memberships").where({ organization_id: organizationId, role: "admin" }).orderBy("user_id").forUpdate().select("user_id");
  return rows.map((r: { user_id: string }) => r.user_id);
}
