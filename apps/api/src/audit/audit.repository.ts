import type { AuditEvent } from "@tagloom/contracts";
import { db as defaultDb } from "@/db/knex";
import { type Db, iso } from "@/db/types";

export type NewAuditEvent = {
  organizationId: string | null;
  actorUserId: string | null;
  actorLabel: string;
  action: string;
  targetType?: string | null;
  targetId?: string | null;
  targetLabel?: string | null;
  details?: Record<string, unknown>;
  ip?: string | null;
};

export async function insertAuditEvents(events: NewAuditEvent[], db: Db = defaultDb): Promise<void> {
  if (!events.length) return;
  await db("audit_events").insert(
    events.map((e) => ({
      organization_id: e.organizationId,
      actor_user_id: e.actorUserId,
      actor_label: e.actorLabel,
      action: e.action,
      target_type: e.targetType ?? null,
      target_id: e.targetId ?? null,
      target_label: e.targetLabel ?? null,
      details: JSON.stringify(e.details ?? {}),
      ip: e.ip ?? null,
    })),
  );
}

export type AuditFilter = { action?: string | undefined; actor?: string | undefined; from?: string | undefined; to?: string | undefined };

/** Newest first; the cursor is the id of the last event of the previous page. */
export async function listAuditEvents(
  organizationId: string,
  filter: AuditFilter,
  page: { limit: number; beforeId?: string | undefined },
  db: Db = defaultDb,
): Promise<AuditEvent[]> {
  const q = db("audit_events").where({ organization_id: organizationId });
  if (filter.action) q.andWhere("action", filter.action);
  if (filter.actor) q.andWhere("actor_label", "ilike", `%${filter.actor.replace(/[\\%_]/g, (c) => `\\${c}`)}%`);
  if (filter.from) q.andWhere("created_at", ">=", filter.from);
  if (filter.to) q.andWhere("created_at", "<", filter.to);
  if (page.beforeId) q.andWhere("id", "<", page.beforeId);
  const rows = await q.orderBy("id", "desc").limit(page.limit);
  return rows.map((r) => ({
    id: String(r.id),
    action: r.action,
    actor: r.actor_label,
    targetType: r.target_type,
    targetId: r.target_id,
    targetLabel: r.target_label,
    details: r.details ?? {},
    ip: r.ip,
    createdAt: iso(r.created_at)!,
  }));
}

export async function listAuditActions(organizationId: string, db: Db = defaultDb): Promise<string[]> {
  const rows = await db("audit_events").where({ organization_id: organizationId }).distinct("action").orderBy("action");
  return rows.map((r: { action: string }) => r.action);
}
