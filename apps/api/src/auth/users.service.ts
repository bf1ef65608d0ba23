import type { Db } from "@/db/types";
import { type UserRow, findUserByEmail } from "./users.repository";

/** The account with this (lower-cased) e-mail address, if any. */
export function getUserByEmail(email: string, db?: Db): Promise<UserRow | null> {
  return findUserByEmail(email, db);
}
