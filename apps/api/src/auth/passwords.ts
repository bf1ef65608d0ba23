import { hash, verify } from "@node-rs/argon2";

// Argon2id with the library's defaults (m = 19 MiB, t = 2, p = 1), the minimum the OWASP Password
// Storage Cheat Sheet recommends for Argon2id.
export function hashPassword(password: string): Promise<string> {
  return hash(password);
}

export async function verifyPassword(hashed: string, password: string): Promise<boolean> {
  try {
    return await verify(hashed, password);
  } catch {
    return false;
  }
}

// Verifying against a real hash when the e-mail is unknown keeps the answer time the same.
let dummyHash: Promise<string> | null = null;
export async function verifyAgainstDummy(password: string): Promise<void> {
  dummyHash ??= hash("not-a-real-password-for-timing");
  await verifyPassword(await dummyHash, password);
}
