import { createHash, randomBytes } from "node:crypto";

/** A random single-use token for a link (256 bits, URL-safe). Only its hash is stored. */
export function createLinkToken(): { token: string; hash: string } {
  const token = randomBytes(32).toString("base64url");
  return { token, hash: hashLinkToken(token) };
}

export function hashLinkToken(token: string): string {
  return createHash("sha256").update(token).digest("hex");
}
