import type { Db } from "@/db/types";
import { deleteUserSessions, requireSessionRotation } from "./users.repository";

/** Every session of the user gets a new id on its next request (after a role change). */
export async function rotateUserSessions(userId: string, db?: Db): Promise<void> {
  await requireSessionRotation(userId, db);
}

/** Ends every session of the user at once. */
export async function endUserSessions(userId: string, db?: Db): Promise<void> {
  await deleteUserSessions(userId, db);
}
