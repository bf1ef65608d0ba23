import { hashPassword } from "@/auth/passwords";
import { getUserByEmail } from "@/auth/users.service";
import { insertUser } from "@/auth/users.repository";
import { db } from "@/db/knex";
import { addMember } from "@/members/members.service";
import { createOrganizationRecord } from "@/orgs/orgs.service";
import { DEMO_ORGANIZATION, DEMO_PASSWORD, demoUsers } from "./demo-data";

/** Loads the demo organization and its members once; later runs change nothing. */
export async function seedDemoData(): Promise<{ created: boolean; organizationId: string | null }> {
  const first = demoUsers[0]!;
  if (await getUserByEmail(first.email)) return { created: false, organizationId: null };
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  const organizationId = await db.transaction(async (trx) => {
    const org = await createOrganizationRecord(DEMO_ORGANIZATION, trx);
    for (const u of demoUsers) {
      const user = await insertUser({ email: u.email, name: u.name, passwordHash, emailVerified: true }, trx);
      await addMember(org.id, user.id, u.role, trx);
    }
    return org.id;
  });
  return { created: true, organizationId };
}
