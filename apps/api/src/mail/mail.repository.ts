import { db as defaultDb } from "@/db/knex";
import type { Db } from "@/db/types";

export type OutboundEmail = {
  id: string;
  organizationId: string | null;
  to: string;
  subject: string;
  text: string;
  html: string;
  kind: string;
  status: "queued" | "sent";
  attempts: number;
};

export async function insertOutboundEmail(
  e: { organizationId: string | null; to: string; subject: string; text: string; html: string; kind: string },
  db: Db = defaultDb,
): Promise<string> {
  const [row] = await db("outbound_emails")
    .insert({ organization_id: e.organizationId, to_address: e.to, subject: e.subject, body_text: e.text, body_html: e.html, kind: e.kind })
    .returning("id");
  return row.id as string;
}

/** Locks a queued message for sending; null when it is gone, already sent or locked by another worker. */
export async function lockQueuedEmail(id: string, db: Db): Promise<OutboundEmail | null> {
  const r = await db("outbound_emails").where({ id, status: "queued" }).forUpdate().skipLocked().first();
  return r
    ? {
        id: r.id,
        organizationId: r.organization_id,
        to: r.to_address,
        subject: r.subject,
        text: r.body_text,
        html: r.body_html,
        kind: r.kind,
        status: r.status,
        attempts: r.attempts,
      }
    : null;
}

export async function markEmailSent(id: string, db: Db): Promise<void> {
  await db("outbound_emails").where({ id }).update({ status: "sent", sent_at: db.fn.now(), attempts: db.raw("attempts + 1"), last_error: null });
}

export async function markEmailAttemptFailed(id: string, error: string, db: Db = defaultDb): Promise<void> {
  await db("outbound_emails").where({ id }).update({ attempts: db.raw("attempts + 1"), last_error: error.slice(0, 500) });
}

/** Queued messages older than the given age (their job may have been lost): for the sweeper. */
export async function listStaleQueuedEmailIds(olderThanSeconds: number, db: Db = defaultDb): Promise<string[]> {
  const rows = await db("outbound_emails")
    .where({ status: "queued" })
    .andWhere("created_at", "<", db.raw(`now() - make_interval(secs => ?)`, [olderThanSeconds]))
    .orderBy("created_at")
    .limit(500)
    .select("id");
  return rows.map((r: { id: string }) => r.id);
}
