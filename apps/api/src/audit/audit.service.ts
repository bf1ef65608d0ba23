import type { AuditEvent, AuditQuery, Page } from "@tagloom/contracts";
import type { Db } from "@/db/types";
import { type NewAuditEvent, insertAuditEvents, listAuditActions, listAuditEvents } from "./audit.repository";

/** Who did something: the signed-in user (or the system when null) and the request's address. */
export type Actor = { userId: string | null; email: string; ip?: string | null };

/** Records one event in the organization's audit log (inside the caller's transaction when given). */
export async function recordAudit(
  db: Db | undefined,
  actor: Actor,
  organizationId: string | null,
  action: string,
  target?: { type: string; id: string; label?: string | null },
  details?: Record<string, unknown>,
): Promise<void> {
  await recordAuditMany(db, actor, [{ organizationId, action, target, details }]);
}

export async function recordAuditMany(
  db: Db | undefined,
  actor: Actor,
  events: Array<{ organizationId: string | null; action: string; target?: { type: string; id: string; label?: string | null } | undefined; details?: Record<string, unknown> | undefined }>,
): Promise<void> {
  const rows: NewAuditEvent[] = events.map((e) => ({
    organizationId: e.organizationId,
    actorUserId: actor.userId,
    actorLabel: actor.email,
    action: e.action,
    targetType: e.target?.type ?? null,
    targetId: e.target?.id ?? null,
    targetLabel: e.target?.label ?? null,
    details: e.details ?? {},
    ip: actor.ip ?? null,
  }));
  await insertAuditEvents(rows, db);
}

export async function getAuditPage(organizationId: string, query: AuditQuery): Promise<Page<AuditEvent> & { actions: string[] }> {
  const items = await listAuditEvents(
    organizationId,
    { action: query.action, actor: query.actor, from: query.from, to: query.to },
    { limit: query.limit + 1, beforeId: query.cursor },
  );
  const more = items.length > query.limit;
  const pageItems = more ? items.slice(0, query.limit) : items;
  return {
    items: pageItems,
    nextCursor: more ? pageItems[pageItems.length - 1]!.id : null,
    actions: await listAuditActions(organizationId),
  };
}
