import { createHash, randomBytes } from "node:crypto";
import type { ApiToken, CreateApiTokenInput, CreatedApiToken } from "@tagloom/contracts";
import { type Actor, recordAudit } from "@/audit/audit.service";
import { db } from "@/db/knex";
import { iso, isUuid } from "@/db/types";
import { NotFoundError } from "@/errors";
import { type TokenIdentity, findApiTokenRow, findTokenByHash, insertApiToken, listApiTokenRows, markApiTokenRevoked, touchApiToken } from "./api-tokens.repository";

// "tgl_" names the kind of secret (so secret scanners and people recognise it); 32 random bytes
// (256 bits) follow in base64url. The prefix shown in lists is "tgl_" and the next 8 characters.
const SCHEME = "tgl_";
const PREFIX_LENGTH = SCHEME.length + 8;
const TOKEN_SHAPE = /^tgl_[A-Za-z0-9_-]{43}$/;

export function hashApiToken(token: string): string {
  return createHash("sha256").update(token).digest("hex");
}

export async function createApiToken(organizationId: string, input: CreateApiTokenInput, actor: Actor & { userId: string }): Promise<CreatedApiToken> {
  const token = `${SCHEME}${randomBytes(32).toString("base64url")}`;
  const prefix = token.slice(0, PREFIX_LENGTH);
  return db.transaction(async (trx) => {
    const row = await insertApiToken({ organizationId, name: input.name, prefix, tokenHash: hashApiToken(token), createdBy: actor.userId }, trx);
    await recordAudit(trx, actor, organizationId, "api_token.created", { type: "api_token", id: row.id, label: input.name }, { prefix });
    return { id: row.id, name: input.name, prefix, token, createdAt: iso(row.createdAt)! };
  });
}

export async function listApiTokens(organizationId: string): Promise<ApiToken[]> {
  return listApiTokenRows(organizationId);
}

export async function revokeApiToken(organizationId: string, tokenId: string, actor: Actor): Promise<void> {
  if (!isUuid(tokenId)) throw new NotFoundError("API token");
  await db.transaction(async (trx) => {
    const existing = await findApiTokenRow(organizationId, tokenId, trx);
    if (!existing) throw new NotFoundError("API token");
    if (existing.revokedAt) return;
    await markApiTokenRevoked(organizationId, tokenId, trx);
    for (const [hash, entry] of known) if (entry.identity.id === tokenId) known.delete(hash);
    await recordAudit(trx, actor, organizationId, "api_token.revoked", { type: "api_token", id: tokenId, label: existing.name }, { prefix: existing.prefix });
  });
}

/** Why a presented token does not authenticate (all answer 401; the reason goes into the message). */
export type TokenRefusal = "malformed" | "unknown" | "revoked";

// "Last used" is kept to the minute: each process writes it at most once a minute per token, so
// a busy pipeline costs one read per request, not a write.
const TOUCH_EVERY_MS = 60_000;
const touched = new Map<string, number>();

// A live token is remembered for a moment by its hash, so a busy pipeline costs no query per
// request: revoking through this process takes effect at once (the entry is forgotten), through
// another API process within KNOWN_TOKEN_MS. Unknown and revoked tokens are never remembered.
const KNOWN_TOKEN_MS = 1000;
const known = new Map<string, { identity: TokenIdentity; until: number }>();

async function findLiveOrStored(tokenHash: string): Promise<TokenIdentity | null> {
  const now = Date.now();
  const hit = known.get(tokenHash);
  if (hit && hit.until > now) return hit.identity;
  const found = await findTokenByHash(tokenHash);
  if (found && !found.revokedAt) {
    if (known.size >= 10_000) known.clear();
    known.set(tokenHash, { identity: found, until: now + KNOWN_TOKEN_MS });
  } else known.delete(tokenHash);
  return found;
}

/** The organization's live token behind a secret, or why there is none. Records its use. */
export async function authenticateApiToken(token: string): Promise<TokenIdentity | TokenRefusal> {
  if (!TOKEN_SHAPE.test(token)) return "malformed";
  const found = await findLiveOrStored(hashApiToken(token));
  if (!found) return "unknown";
  if (found.revokedAt) return "revoked";
  const now = Date.now();
  if ((touched.get(found.id) ?? 0) + TOUCH_EVERY_MS <= now) {
    if (touched.size > 10_000) touched.clear();
    touched.set(found.id, now);
    await touchApiToken(found.id);
  }
  return found;
}
