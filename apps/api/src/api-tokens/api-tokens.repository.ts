import type { ApiToken } from "@tagloom/contracts";
import { db as defaultDb } from "@/db/knex";
import { type Db, iso } from "@/db/types";

/** A token found by its hash, for authenticating a request. */
export type TokenIdentity = { id: string; organizationId: string; name: string; revokedAt: Date | null };

// eslint-disable-next-line @typescript-eslint/no-explicit-any
const toApiToken = (r: any): ApiToken => ({
  id: r.id,
  name: r.name,
  prefix: r.prefix,
  createdAt: iso(r.created_at)!,
  lastUsedAt: iso(r.last_used_at),
  revokedAt: iso(r.revoked_at),
  createdBy: r.creator_name ? `${r.creator_name} <${r.creator_email}>` : null,
});

export async function insertApiToken(
  t: { organizationId: string; name: string; prefix: string; tokenHash: string; createdBy: string },
  db: Db = defaultDb,
): Promise<{ id: string; createdAt: Date }> {
  const [row] = await db("api_tokens")
    .insert({ organization_id: t.organizationId, name: t.name, prefix: t.prefix, token_hash: t.tokenHash, created_by: t.createdBy })
    .returning(["id", "created_at"]);
  return { id: row.id, createdAt: row.created_at };
}

export async function listApiTokenRows(organizationId: string, db: Db = defaultDb): Promise<ApiToken[]> {
  const rows = await db("api_tokens as t")
    .leftJoin("auth_user as u", "u.id", "t.created_by")
    .where("t.organization_id", organizationId)
    .orderBy([{ column: "t.created_at", order: "desc" }, { column: "t.id", order: "desc" }])
    .limit(500)
    .select("t.id", "t.name", "t.prefix", "t.created_at", "t.last_used_at", "t.revoked_at", "u.name as creator_name", "u.email as creator_email");
  return rows.map(toApiToken);
}

export async function findApiTokenRow(organizationId: string, id: string, db: Db = defaultDb): Promise<ApiToken | null> {
  const r = await db("api_tokens as t")
    .leftJoin("auth_user as u", "u.id", "t.created_by")
    .where({ "t.organization_id": organizationId, "t.id": id })
    .first("t.id", "t.name", "t.prefix", "t.created_at", "t.last_used_at", "t.revoked_at", "u.name as creator_name", "u.email as creator_email");
  return r ? toApiToken(r) : null;
}

/** Marks the token revoked (the first revocation's time is kept); false when it does not exist. */
export async function markApiTokenRevoked(organizationId: string, id: string, db: Db = defaultDb): Promise<boolean> {
  const n = await db("api_tokens")
    .where({ organization_id: organizationId, id })
    .update({ revoked_at: db.raw("coalesce(revoked_at, now())") });
  return n > 0;
}

export async function findTokenByHash(tokenHash: string, db: Db = defaultDb): Promise<TokenIdentity | null> {
  const r = await db("api_tokens").where({ token_hash: tokenHash }).first("id", "organization_id", "name", "revoked_at");
  return r ? { id: r.id, organizationId: r.organization_id, name: r.name, revokedAt: r.revoked_at } : null;
}

/** Records use; written at most once a minute per token so that busy pipelines do not hammer the row. */
export async function touchApiToken(id: string, db: Db = defaultDb): Promise<void> {
  await db("api_tokens")
    .where({ id })
    .andWhere((q) => q.whereNull("last_used_at").orWhere("last_used_at", "<", db.raw("now() - interval '1 minute'")))
    .update({ last_used_at: db.fn.now() });
}
