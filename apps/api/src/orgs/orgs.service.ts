import { type Actor, recordAudit } from "@/audit/audit.service";
import { endBillingOfDeletedOrganization } from "@/billing/billing.service";
import { db } from "@/db/knex";
import type { Db } from "@/db/types";
import { NotFoundError, ValidationError } from "@/errors";
import { logger } from "@/logger";
import { addMember } from "@/members/members.service";
import { type Organization, deleteOrganization, findOrganization, insertOrganization, renameOrganization } from "./orgs.repository";

export function createOrganizationRecord(name: string, trx: Db): Promise<Organization> {
  return insertOrganization(name, trx);
}

/** A signed-in user founds another organization and becomes its admin. */
export async function createOrganization(name: string, actor: Actor & { userId: string }): Promise<Organization> {
  return db.transaction(async (trx) => {
    const org = await insertOrganization(name, trx);
    await addMember(org.id, actor.userId, "admin", trx);
    await recordAudit(trx, actor, org.id, "organization.created", { type: "organization", id: org.id, label: org.name });
    return org;
  });
}

export async function getOrganization(id: string): Promise<Organization> {
  const org = await findOrganization(id);
  if (!org) throw new NotFoundError("organization");
  return org;
}

export async function renameOrganizationAs(id: string, name: string, actor: Actor): Promise<Organization> {
  return db.transaction(async (trx) => {
    const org = await findOrganization(id, trx);
    if (!org) throw new NotFoundError("organization");
    await renameOrganization(id, name, trx);
    await recordAudit(trx, actor, id, "organization.renamed", { type: "organization", id, label: name }, { from: org.name, to: name });
    return { ...org, name };
  });
}

/**
 * Deletes the organization and, through ON DELETE CASCADE, every row of its data, for good. The
 * caller must type the organization's name. The event is logged by the process (the organization's
 * own audit log goes with it).
 */
export async function deleteOrganizationForGood(id: string, confirmName: string, actor: Actor): Promise<void> {
  const org = await findOrganization(id);
  if (!org) throw new NotFoundError("organization");
  if (confirmName.trim() !== org.name) {
    throw new ValidationError("Type the organization's name exactly to confirm.", { fields: { confirmName: ["Does not match the name."] } });
  }
  await endBillingOfDeletedOrganization(id);
  await deleteOrganization(id);
  logger.warn({ organizationId: id, name: org.name, by: actor.email }, "organization deleted for good");
}
