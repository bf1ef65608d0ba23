import { endBillingOfDeletedOrganization } from "@/billing/billing.service";
import { db } from "@/db/knex";
import { logger } from "@/logger";
import { deleteOrganization } from "@/orgs/orgs.repository";
import { DEMO_ORGANIZATION, demoUsers } from "./demo-data";

/**
 * Deletes the demo organization (every row of its data goes with it by ON DELETE CASCADE) and the
 * demo users, and nothing else: other organizations and their members stay. Returns how many
 * organizations were removed (0 when there was no demo).
 */
export async function dropDemoOrganization(): Promise<number> {
  const emails = demoUsers.map((u) => u.email);
  const orgIds: string[] = await db("organizations as o")
    .join("memberships as m", "m.organization_id", "o.id")
    .join("auth_user as u", "u.id", "m.user_id")
    .where("o.name", DEMO_ORGANIZATION)
    .whereIn("u.email", emails)
    .distinct("o.id")
    .pluck("o.id");
  for (const id of orgIds) {
    try {
      // Ends the demo's subscription on the payments service, as deleting an organization does.
      await endBillingOfDeletedOrganization(id);
    } catch (err) {
      // The payments fake keeps its data in memory: after a restart it no longer knows the old
      // subscription, which must not keep the demo from being reset.
      logger.warn({ err, organizationId: id }, "demo reset: could not end the old demo subscription; deleting anyway");
    }
    await deleteOrganization(id);
  }
  await db("auth_user").whereIn("email", emails).delete();
  return orgIds.length;
}
