import { randomUUID } from "node:crypto";
import { db as defaultDb } from "@/db/knex";
import type { Db } from "@/db/types";

export type UserRow = {
  id: string;
  email: string;
  name: string;
  passwordHash: string;
  emailVerifiedAt: Date | null;
  createdAt: Date;
};

type DbUser = {
  id: string;
  email: string;
  name: string;
  password_hash: string;
  email_verified_at: Date | null;
  created_at: Date;
};

const toUser = (r: DbUser): UserRow => ({
  id: r.id,
  email: r.email,
  name: r.name,
  passwordHash: r.password_hash,
  emailVerifiedAt: r.email_verified_at,
  createdAt: r.created_at,
});

export async function findUserByEmail(email: string, db: Db = defaultDb): Promise<UserRow | null> {
  const row = await db<DbUser>("auth_user").where({ email }).first();
  return row ? toUser(row) : null;
}

export async function findUserById(id: string, db: Db = defaultDb): Promise<UserRow | null> {
  const row = await db<DbUser>("auth_user").where({ id }).first();
  return row ? toUser(row) : null;
}

export async function insertUser(
  input: { email: string; name: string; passwordHash: string; emailVerified: boolean },
  db: Db = defaultDb,
): Promise<UserRow> {
  const [row] = await db<DbUser>("auth_user")
    .insert({
      id: randomUUID(),
      email: input.email,
      name: input.name,
      password_hash: input.passwordHash,
      email_verified_at: input.emailVerified ? new Date() : null,
    })
    .returning("*");
  return toUser(row!);
}

export async function updatePasswordHash(userId: string, passwordHash: string, db: Db = defaultDb): Promise<void> {
  await db("auth_user").where({ id: userId }).update({ password_hash: passwordHash });
}

export async function markEmailVerified(userId: string, db: Db = defaultDb): Promise<void> {
  await db("auth_user").where({ id: userId }).whereNull("email_verified_at").update({ email_verified_at: db.fn.now() });
}

/** Makes every existing session of the user rotate on its next request. */
export async function requireSessionRotation(userId: string, db: Db = defaultDb): Promise<void> {
  await db("auth_user").where({ id: userId }).update({ rotate_sessions_before: db.fn.now() });
}

export async function deleteUserSessions(userId: string, db: Db = defaultDb): Promise<void> {
  await db("user_session").where({ user_id: userId }).delete();
}

export type EmailTokenPurpose = "reset_password" | "verify_email";
export type EmailTokenRow = { id: string; userId: string; purpose: EmailTokenPurpose; email: string; expiresAt: Date; usedAt: Date | null };

export async function insertEmailToken(
  input: { userId: string; purpose: EmailTokenPurpose; email: string; tokenHash: string; expiresAt: Date },
  db: Db = defaultDb,
): Promise<void> {
  await db("email_tokens").insert({
    user_id: input.userId,
    purpose: input.purpose,
    email: input.email,
    token_hash: input.tokenHash,
    expires_at: input.expiresAt,
  });
}

/** Locks and returns the token row so that two concurrent uses cannot both succeed. */
export async function findEmailTokenForUpdate(tokenHash: string, purpose: EmailTokenPurpose, db: Db): Promise<EmailTokenRow | null> {
  const row = await db("email_tokens").where({ token_hash: tokenHash, purpose }).forUpdate().first();
  return row
    ? { id: row.id, userId: row.user_id, purpose: row.purpose, email: row.email, expiresAt: row.expires_at, usedAt: row.used_at }
    : null;
}

export async function markEmailTokenUsed(id: string, db: Db): Promise<void> {
  await db("email_tokens").where({ id }).update({ used_at: db.fn.now() });
}

/** Ends every other unused token of the same purpose for the user (only the newest link works). */
export async function expireOtherEmailTokens(userId: string, purpose: EmailTokenPurpose, db: Db): Promise<void> {
  await db("email_tokens").where({ user_id: userId, purpose }).whereNull("used_at").update({ used_at: db.fn.now() });
}
