import { db as defaultDb } from "@/db/knex";
import type { Db } from "@/db/types";

export type BillingAccountRow = {
  organizationId: string;
  customerId: string | null;
  subscriptionId: string | null;
  subscriptionItemId: string | null;
  subscriptionStatus: string | null;
  paidSeats: number;
  cancelAtPeriodEnd: boolean;
  currentPeriodEnd: Date | null;
  seatPrice: number | null;
  currency: string | null;
};

export type SubscriptionState = Omit<BillingAccountRow, "organizationId" | "customerId">;

export type InvoiceRow = {
  id: string;
  subscriptionId: string | null;
  number: string | null;
  status: string;
  amountDue: number;
  amountPaid: number;
  currency: string;
  periodStart: Date | null;
  periodEnd: Date | null;
  issuedAt: Date;
};

// eslint-disable-next-line @typescript-eslint/no-explicit-any
const toAccount = (r: any): BillingAccountRow => ({
  organizationId: r.organization_id,
  customerId: r.customer_id,
  subscriptionId: r.subscription_id,
  subscriptionItemId: r.subscription_item_id,
  subscriptionStatus: r.subscription_status,
  paidSeats: r.paid_seats,
  cancelAtPeriodEnd: r.cancel_at_period_end,
  currentPeriodEnd: r.current_period_end,
  seatPrice: r.seat_price,
  currency: r.currency,
});

export async function findBillingAccount(organizationId: string, db: Db = defaultDb, lock = false): Promise<BillingAccountRow | null> {
  const q = db("billing_accounts").where({ organization_id: organizationId });
  if (lock) q.forUpdate();
  const r = await q.first();
  return r ? toAccount(r) : null;
}

export async function findBillingAccountByCustomer(customerId: string, db: Db = defaultDb, lock = false): Promise<BillingAccountRow | null> {
  const q = db("billing_accounts").where({ customer_id: customerId });
  if (lock) q.forUpdate();
  const r = await q.first();
  return r ? toAccount(r) : null;
}

/** Stores the payments customer of an organization (creating its billing account). */
export async function saveCustomerId(organizationId: string, customerId: string, db: Db = defaultDb): Promise<void> {
  await db("billing_accounts")
    .insert({ organization_id: organizationId, customer_id: customerId })
    .onConflict("organization_id")
    .merge({ customer_id: customerId, updated_at: db.fn.now() });
}

export async function saveSubscriptionState(organizationId: string, s: SubscriptionState, db: Db = defaultDb): Promise<void> {
  await db("billing_accounts").where({ organization_id: organizationId }).update({
    subscription_id: s.subscriptionId,
    subscription_item_id: s.subscriptionItemId,
    subscription_status: s.subscriptionStatus,
    paid_seats: s.paidSeats,
    cancel_at_period_end: s.cancelAtPeriodEnd,
    current_period_end: s.currentPeriodEnd,
    seat_price: s.seatPrice,
    currency: s.currency,
    updated_at: db.fn.now(),
  });
}

/**
 * Serialises every change of an organization's seat use (invitations, seat changes) on its row.
 * NO KEY UPDATE conflicts with itself but not with the KEY SHARE locks that inserts of rows
 * referencing the organization take, so the rest of the organization's work is not blocked.
 */
export async function lockOrganizationSeats(organizationId: string, trx: Db): Promise<void> {
  await trx.raw("SELECT id FROM organizations WHERE id = ? FOR NO KEY UPDATE", [organizationId]);
}

/**
 * Members and pending (not accepted, withdrawn or expired) invitations. A read-only count over
 * the members' and invitations' tables, kept here because the invitations service calls billing
 * (a call back through its service would be an import cycle).
 */
export async function countSeatUse(organizationId: string, db: Db = defaultDb): Promise<{ members: number; pendingInvitations: number }> {
  const r = await db.raw(
    `SELECT (SELECT count(*) FROM memberships WHERE organization_id = :org)::int AS members,
            (SELECT count(*) FROM invitations WHERE organization_id = :org AND accepted_at IS NULL
               AND revoked_at IS NULL AND expires_at > now())::int AS pending`,
    { org: organizationId },
  );
  return { members: r.rows[0].members, pendingInvitations: r.rows[0].pending };
}

export async function upsertInvoices(organizationId: string, invoices: InvoiceRow[], db: Db = defaultDb): Promise<void> {
  if (!invoices.length) return;
  await db("billing_invoices")
    .insert(
      invoices.map((i) => ({
        id: i.id,
        organization_id: organizationId,
        subscription_id: i.subscriptionId,
        number: i.number,
        status: i.status,
        amount_due: i.amountDue,
        amount_paid: i.amountPaid,
        currency: i.currency,
        period_start: i.periodStart,
        period_end: i.periodEnd,
        issued_at: i.issuedAt,
      })),
    )
    .onConflict("id")
    .merge(["status", "amount_due", "amount_paid", "number", "period_start", "period_end"]);
}

export async function listInvoices(organizationId: string, limit: number, db: Db = defaultDb): Promise<InvoiceRow[]> {
  const rows = await db("billing_invoices").where({ organization_id: organizationId }).orderBy([{ column: "issued_at", order: "desc" }, { column: "id", order: "desc" }]).limit(limit);
  return rows.map((r) => ({
    id: r.id,
    subscriptionId: r.subscription_id,
    number: r.number,
    status: r.status,
    amountDue: r.amount_due,
    amountPaid: r.amount_paid,
    currency: r.currency,
    periodStart: r.period_start,
    periodEnd: r.period_end,
    issuedAt: r.issued_at,
  }));
}

export async function insertCheckout(c: { id: string; organizationId: string; seats: number; createdBy: string | null }, db: Db = defaultDb): Promise<void> {
  await db("billing_checkouts").insert({ id: c.id, organization_id: c.organizationId, seats: c.seats, created_by: c.createdBy });
}

export async function markCheckoutComplete(organizationId: string, id: string, db: Db = defaultDb): Promise<boolean> {
  const n = await db("billing_checkouts").where({ organization_id: organizationId, id, status: "open" }).update({ status: "complete", completed_at: db.fn.now() });
  return n > 0;
}

/** True when a checkout started in the last day has not been confirmed by the payments service. */
export async function hasOpenCheckout(organizationId: string, db: Db = defaultDb): Promise<boolean> {
  const r = await db("billing_checkouts")
    .where({ organization_id: organizationId, status: "open" })
    .where("created_at", ">", db.raw("now() - interval '1 day'"))
    .first("id");
  return Boolean(r);
}

export async function isWebhookEventHandled(id: string, db: Db = defaultDb): Promise<boolean> {
  return Boolean(await db("billing_webhook_events").where({ id }).first("id"));
}

/** Records an event id; false when it was already recorded (a replay). */
export async function recordWebhookEvent(e: { id: string; type: string; organizationId: string | null }, db: Db = defaultDb): Promise<boolean> {
  const rows = await db("billing_webhook_events").insert({ id: e.id, type: e.type, organization_id: e.organizationId }).onConflict("id").ignore().returning("id");
  return rows.length > 0;
}
