import type { Me, SignInInput, SignUpInput } from "@tagloom/contracts";
import { type Actor, recordAudit, recordAuditMany } from "@/audit/audit.service";
import { env } from "@/config/env";
import { db } from "@/db/knex";
import { AppError, ConflictError, ValidationError } from "@/errors";
import { acceptInvitationForNewUser, findPendingInvitationByToken } from "@/invitations/invitations.service";
import { dispatchEmails, queueEmail } from "@/mail/mail.service";
import { composeEmail } from "@/mail/templates";
import { addMember, listMembershipsForUser } from "@/members/members.service";
import { createOrganizationRecord } from "@/orgs/orgs.service";
import { hashPassword, verifyAgainstDummy, verifyPassword } from "./passwords";
import { createLinkToken, hashLinkToken } from "./tokens";
import {
  type EmailTokenPurpose,
  type UserRow,
  deleteUserSessions,
  expireOtherEmailTokens,
  findEmailTokenForUpdate,
  findUserByEmail,
  findUserById,
  insertEmailToken,
  insertUser,
  markEmailTokenUsed,
  markEmailVerified,
  updatePasswordHash,
} from "./users.repository";

const RESET_TTL_MS = 60 * 60 * 1000;
const VERIFY_TTL_MS = 3 * 24 * 60 * 60 * 1000;

export class InvalidCredentialsError extends AppError {
  constructor() {
    // One answer for an unknown address and a wrong password.
    super(401, "invalid_credentials", "E-mail or password is incorrect.");
  }
}

export class InvalidLinkError extends AppError {
  constructor(what: string) {
    super(400, "invalid_link", `This ${what} link is not valid: it was already used, replaced by a newer one, or it expired.`);
  }
}

/** Creates an account; with an invitation it joins that organization, otherwise it founds one. */
export async function signUp(input: SignUpInput, ip: string | null): Promise<{ userId: string; organizationId: string }> {
  const passwordHash = await hashPassword(input.password);
  const emailIds: string[] = [];
  const result = await db.transaction(async (trx) => {
    if (await findUserByEmail(input.email, trx)) {
      throw new ConflictError("An account with this e-mail address already exists. Sign in instead.", { fields: { email: ["Already registered."] } }, "email_taken");
    }
    if (input.invitationToken) {
      const invitation = await findPendingInvitationByToken(input.invitationToken, trx, { lock: true });
      if (invitation.email !== input.email) {
        throw new ValidationError(`This invitation was sent to ${invitation.email}. Sign up with that address.`, {
          fields: { email: [`Use ${invitation.email}.`] },
        });
      }
      // Following the e-mailed link proves the address.
      const user = await insertUser({ email: input.email, name: input.name, passwordHash, emailVerified: true }, trx);
      await acceptInvitationForNewUser(invitation, user, ip, trx);
      return { userId: user.id, organizationId: invitation.organizationId };
    }
    const user = await insertUser({ email: input.email, name: input.name, passwordHash, emailVerified: false }, trx);
    const actor: Actor = { userId: user.id, email: user.email, ip };
    const org = await createOrganizationRecord(input.organizationName!, trx);
    await addMember(org.id, user.id, "admin", trx);
    await recordAuditMany(trx, actor, [
      { organizationId: org.id, action: "organization.created", target: { type: "organization", id: org.id, label: org.name } },
      { organizationId: org.id, action: "user.signed_up", target: { type: "user", id: user.id, label: user.email } },
    ]);
    emailIds.push(await createVerificationEmail(user, trx));
    return { userId: user.id, organizationId: org.id };
  });
  await dispatchEmails(emailIds);
  return result;
}

/** Checks e-mail and password; the same error for an unknown address and a wrong password. */
export async function signIn(input: SignInInput, ip: string | null): Promise<UserRow> {
  const user = await findUserByEmail(input.email);
  if (!user) {
    await verifyAgainstDummy(input.password);
    throw new InvalidCredentialsError();
  }
  if (!(await verifyPassword(user.passwordHash, input.password))) throw new InvalidCredentialsError();
  const memberships = await listMembershipsForUser(user.id);
  await recordAuditMany(
    undefined,
    { userId: user.id, email: user.email, ip },
    memberships.map((m) => ({ organizationId: m.organizationId, action: "user.signed_in", target: { type: "user", id: user.id, label: user.email } })),
  );
  return user;
}

export async function recordSignOut(userId: string, email: string, ip: string | null): Promise<void> {
  const memberships = await listMembershipsForUser(userId);
  await recordAuditMany(
    undefined,
    { userId, email, ip },
    memberships.map((m) => ({ organizationId: m.organizationId, action: "user.signed_out", target: { type: "user", id: userId, label: email } })),
  );
}

export async function getMe(userId: string): Promise<Me | null> {
  const user = await findUserById(userId);
  if (!user) return null;
  const memberships = await listMembershipsForUser(userId);
  return {
    user: { id: user.id, email: user.email, name: user.name, emailVerified: user.emailVerifiedAt !== null },
    memberships: memberships.map((m) => ({ organizationId: m.organizationId, organizationName: m.organizationName, role: m.role })),
  };
}

async function createToken(user: UserRow, purpose: EmailTokenPurpose, ttlMs: number, trx: import("knex").Knex.Transaction): Promise<string> {
  await expireOtherEmailTokens(user.id, purpose, trx);
  const { token, hash } = createLinkToken();
  await insertEmailToken({ userId: user.id, purpose, email: user.email, tokenHash: hash, expiresAt: new Date(Date.now() + ttlMs) }, trx);
  return token;
}

async function createVerificationEmail(user: UserRow, trx: import("knex").Knex.Transaction): Promise<string> {
  const token = await createToken(user, "verify_email", VERIFY_TTL_MS, trx);
  const url = `${env.publicUrl}/verify-email?token=${encodeURIComponent(token)}`;
  return queueEmail(trx, {
    to: user.email,
    organizationId: null,
    kind: "verify_email",
    content: composeEmail(
      "Confirm your e-mail address for Tagloom",
      [`Hello ${user.name},`, "Please confirm that this is your e-mail address. The link works once and expires in 3 days."],
      { label: "Confirm e-mail address", url },
      "If you did not create a Tagloom account, ignore this message.",
    ),
  });
}

export async function resendVerification(userId: string): Promise<void> {
  const ids = await db.transaction(async (trx) => {
    const user = await findUserById(userId, trx);
    if (!user || user.emailVerifiedAt) return [];
    return [await createVerificationEmail(user, trx)];
  });
  await dispatchEmails(ids);
}

export async function verifyEmail(token: string, ip: string | null): Promise<void> {
  await db.transaction(async (trx) => {
    const row = await findEmailTokenForUpdate(hashLinkToken(token), "verify_email", trx);
    if (!row || row.usedAt || row.expiresAt.getTime() < Date.now()) throw new InvalidLinkError("confirmation");
    const user = await findUserById(row.userId, trx);
    if (!user || user.email !== row.email) throw new InvalidLinkError("confirmation");
    await markEmailTokenUsed(row.id, trx);
    await markEmailVerified(user.id, trx);
    await recordAudit(trx, { userId: user.id, email: user.email, ip }, null, "user.email_verified", { type: "user", id: user.id, label: user.email });
  });
}

/** Always succeeds from the caller's view, so the answer does not reveal whether an account exists. */
export async function requestPasswordReset(email: string): Promise<void> {
  const ids = await db.transaction(async (trx) => {
    const user = await findUserByEmail(email, trx);
    if (!user) return [];
    const token = await createToken(user, "reset_password", RESET_TTL_MS, trx);
    const url = `${env.publicUrl}/reset-password?token=${encodeURIComponent(token)}`;
    return [
      await queueEmail(trx, {
        to: user.email,
        organizationId: null,
        kind: "reset_password",
        content: composeEmail(
          "Reset your Tagloom password",
          [`Hello ${user.name},`, "Someone asked to reset the password of your Tagloom account. The link works once and expires in one hour."],
          { label: "Choose a new password", url },
          "If it was not you, ignore this message: your password stays as it is.",
        ),
      }),
    ];
  });
  await dispatchEmails(ids);
}

/** Sets a new password from a reset link and ends every session of the account. */
export async function confirmPasswordReset(token: string, password: string, ip: string | null): Promise<void> {
  const passwordHash = await hashPassword(password);
  await db.transaction(async (trx) => {
    const row = await findEmailTokenForUpdate(hashLinkToken(token), "reset_password", trx);
    if (!row || row.usedAt || row.expiresAt.getTime() < Date.now()) throw new InvalidLinkError("password reset");
    const user = await findUserById(row.userId, trx);
    if (!user) throw new InvalidLinkError("password reset");
    await markEmailTokenUsed(row.id, trx);
    await updatePasswordHash(user.id, passwordHash, trx);
    // The link proves the address too.
    await markEmailVerified(user.id, trx);
    await deleteUserSessions(user.id, trx);
    const memberships = await listMembershipsForUser(user.id, trx);
    await recordAuditMany(
      trx,
      { userId: user.id, email: user.email, ip },
      memberships.map((m) => ({ organizationId: m.organizationId, action: "user.password_reset", target: { type: "user", id: user.id, label: user.email } })),
    );
  });
}
