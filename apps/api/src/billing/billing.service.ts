import type { BillingState, CheckoutStarted, SeatLimitDetails } from "@tagloom/contracts";
import { type Actor, recordAudit } from "@/audit/audit.service";
import { env } from "@/config/env";
import { db } from "@/db/knex";
import { type Db, iso } from "@/db/types";
import { AppError, ConflictError } from "@/errors";
import {
  type BillingAccountRow,
  countSeatUse,
  findBillingAccount,
  hasOpenCheckout,
  insertCheckout,
  listInvoices,
  lockOrganizationSeats,
  saveCustomerId,
  saveSubscriptionState,
  upsertInvoices,
} from "./billing.repository";
import { callPayments, payments } from "./payments-client";
import { fetchInvoices, toSubscriptionState } from "./provider-state";
import { hasLiveSubscription, seatLimitOf } from "./seats";

const count = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;
const inUse = (u: { members: number; pendingInvitations: number }) =>
  `${count(u.members, "member", "members")} and ${count(u.pendingInvitations, "pending invitation", "pending invitations")}`;

export class SeatLimitError extends AppError {
  constructor(details: SeatLimitDetails & { members: number; pendingInvitations: number }) {
    super(
      402,
      "seat_limit_reached",
      `All ${details.seatLimit} seats are in use (${inUse(details)}). An admin can add seats on the Billing page.`,
      { seatsUsed: details.seatsUsed, seatLimit: details.seatLimit, plan: details.plan },
    );
  }
}

async function seatUse(organizationId: string, trx: Db) {
  const [account, use] = await Promise.all([findBillingAccount(organizationId, trx), countSeatUse(organizationId, trx)]);
  const { plan, seatLimit } = seatLimitOf(account, env.BILLING_FREE_SEATS);
  return { account, plan, seatLimit, ...use, seatsUsed: use.members + use.pendingInvitations };
}

/**
 * Takes one seat for a new invitation inside the caller's transaction, or refuses with 402.
 * The row lock on the organization makes two invitations racing for the last seat take turns,
 * so exactly one of them gets it.
 */
export async function reserveSeat(organizationId: string, trx: Db): Promise<void> {
  await lockOrganizationSeats(organizationId, trx);
  const u = await seatUse(organizationId, trx);
  if (u.seatsUsed + 1 > u.seatLimit) throw new SeatLimitError(u);
}

export async function getBillingState(organizationId: string): Promise<BillingState> {
  const u = await seatUse(organizationId, db);
  const [invoices, checkoutPending] = await Promise.all([listInvoices(organizationId, 24), hasOpenCheckout(organizationId)]);
  const a = u.account;
  const live = hasLiveSubscription(a);
  return {
    plan: u.plan,
    freeSeats: env.BILLING_FREE_SEATS,
    seatLimit: u.seatLimit,
    seatsUsed: u.seatsUsed,
    members: u.members,
    pendingInvitations: u.pendingInvitations,
    subscription:
      a?.subscriptionId && a.subscriptionStatus
        ? {
            status: a.subscriptionStatus,
            seats: a.paidSeats,
            cancelAtPeriodEnd: a.cancelAtPeriodEnd,
            currentPeriodEnd: iso(a.currentPeriodEnd),
            seatPrice: a.seatPrice,
            currency: a.currency,
          }
        : null,
    nextInvoiceAt: live && !a.cancelAtPeriodEnd ? iso(a.currentPeriodEnd) : null,
    paymentFailed: live && (a.subscriptionStatus === "past_due" || a.subscriptionStatus === "unpaid"),
    checkoutPending: checkoutPending && !live,
    invoices: invoices.map((i) => ({
      id: i.id,
      number: i.number,
      status: i.status,
      amountDue: i.amountDue,
      amountPaid: i.amountPaid,
      currency: i.currency,
      periodStart: iso(i.periodStart),
      periodEnd: iso(i.periodEnd),
      createdAt: iso(i.issuedAt)!,
    })),
  };
}

const billingUrl = (organizationId: string) => `${env.publicUrl}/o/${organizationId}/billing`;

/**
 * Starts a checkout for a per-seat subscription. Nothing about seats changes here: the seats are
 * raised only when the payments service's signed webhook says the checkout was paid.
 */
export async function startCheckout(organizationId: string, seats: number, actor: Actor & { userId: string }): Promise<CheckoutStarted> {
  const u = await seatUse(organizationId, db);
  if (hasLiveSubscription(u.account)) {
    throw new ConflictError("This organization already pays per seat; change the number of seats instead.", null, "already_subscribed");
  }
  const minimum = Math.max(u.seatsUsed, env.BILLING_FREE_SEATS + 1);
  if (seats < minimum) {
    throw new ConflictError(
      `Choose at least ${minimum} seats: the paid plan starts above the free plan's ${env.BILLING_FREE_SEATS} seats and must cover the ${u.seatsUsed} in use.`,
      { fields: { seats: [`At least ${minimum}.`] }, minimum },
      "too_few_seats",
    );
  }
  const customerId = u.account?.customerId ?? (await createCustomer(organizationId));
  const session = await callPayments(() =>
    payments.checkout.sessions.create({
      mode: "subscription",
      customer: customerId,
      client_reference_id: organizationId,
      line_items: [{ price: env.STRIPE_SEAT_PRICE, quantity: seats }],
      metadata: { organizationId },
      subscription_data: { metadata: { organizationId } },
      // The return page only shows "waiting for the payment to be confirmed"; it changes nothing.
      success_url: `${billingUrl(organizationId)}?checkout=returned`,
      cancel_url: `${billingUrl(organizationId)}?checkout=cancelled`,
    }),
  );
  if (!session.url) throw new AppError(502, "payments_error", "The payments service did not return a checkout page.");
  await db.transaction(async (trx) => {
    await insertCheckout({ id: session.id, organizationId, seats, createdBy: actor.userId }, trx);
    await recordAudit(trx, actor, organizationId, "billing.checkout_started", { type: "checkout", id: session.id }, { seats });
  });
  return { checkoutId: session.id, url: session.url };
}

async function createCustomer(organizationId: string): Promise<string> {
  // Only the organization's id goes to the payments service; it asks the payer for the rest.
  const customer = await callPayments(() => payments.customers.create({ description: `Tagloom organization ${organizationId}`, metadata: { organizationId } }));
  await saveCustomerId(organizationId, customer.id);
  return customer.id;
}

async function liveAccount(organizationId: string, trx: Db): Promise<BillingAccountRow & { subscriptionId: string }> {
  const a = await findBillingAccount(organizationId, trx, true);
  if (!hasLiveSubscription(a)) throw new ConflictError("This organization has no paid subscription; buy seats first.", null, "no_subscription");
  return a;
}

/** Re-reads subscription and invoices from the payments service into our copy. */
async function refreshFromProvider(organizationId: string, account: BillingAccountRow & { subscriptionId: string }, trx: Db): Promise<void> {
  const sub = await callPayments(() => payments.subscriptions.retrieve(account.subscriptionId));
  await saveSubscriptionState(organizationId, toSubscriptionState(sub), trx);
  if (account.customerId) {
    const customerId = account.customerId;
    await upsertInvoices(organizationId, await callPayments(() => fetchInvoices(customerId)), trx);
  }
}

/**
 * Changes the paid seat count. Going below the seats in use is refused with the reason. The
 * organization stays locked while the payments service is asked, so no invitation slips in, and
 * a failed call rolls everything back.
 */
export async function changeSeats(organizationId: string, seats: number, actor: Actor): Promise<BillingState> {
  await db.transaction(async (trx) => {
    await lockOrganizationSeats(organizationId, trx);
    const account = await liveAccount(organizationId, trx);
    const use = await countSeatUse(organizationId, trx);
    const used = use.members + use.pendingInvitations;
    if (seats < used) {
      throw new ConflictError(
        `${used} seats are in use (${inUse(use)}). Remove members or withdraw invitations before going below ${used} seats.`,
        { fields: { seats: [`At least ${used}.`] }, seatsUsed: used },
        "seats_in_use",
      );
    }
    if (seats === account.paidSeats) return;
    await callPayments(() =>
      payments.subscriptions.update(account.subscriptionId, {
        items: [{ id: account.subscriptionItemId ?? undefined, quantity: seats }],
        proration_behavior: "always_invoice",
      }),
    );
    await refreshFromProvider(organizationId, account, trx);
    await recordAudit(trx, actor, organizationId, "billing.seats_changed", { type: "subscription", id: account.subscriptionId }, { from: account.paidSeats, to: seats });
  });
  return getBillingState(organizationId);
}

/** Schedules the end of the subscription at the end of the paid period, or withdraws that. */
export async function setCancelAtPeriodEnd(organizationId: string, cancel: boolean, actor: Actor): Promise<BillingState> {
  await db.transaction(async (trx) => {
    const account = await liveAccount(organizationId, trx);
    if (account.cancelAtPeriodEnd === cancel) return;
    await callPayments(() => payments.subscriptions.update(account.subscriptionId, { cancel_at_period_end: cancel }));
    await refreshFromProvider(organizationId, account, trx);
    await recordAudit(trx, actor, organizationId, cancel ? "billing.cancel_scheduled" : "billing.cancel_withdrawn", { type: "subscription", id: account.subscriptionId });
  });
  return getBillingState(organizationId);
}

/** Charges the open invoice of a past-due subscription again. */
export async function retryPayment(organizationId: string, actor: Actor): Promise<BillingState> {
  await db.transaction(async (trx) => {
    const account = await liveAccount(organizationId, trx);
    if (!account.customerId) throw new ConflictError("There is no unpaid invoice to retry.", null, "nothing_to_retry");
    const customerId = account.customerId;
    const open = (await callPayments(() => fetchInvoices(customerId))).find((i) => i.status === "open");
    if (!open) throw new ConflictError("There is no unpaid invoice to retry.", null, "nothing_to_retry");
    await callPayments(() => payments.invoices.pay(open.id));
    await refreshFromProvider(organizationId, account, trx);
    await recordAudit(trx, actor, organizationId, "billing.payment_retried", { type: "invoice", id: open.id, label: open.number });
  });
  return getBillingState(organizationId);
}

/**
 * Ends a live subscription at once before its organization is deleted for good (nobody would be
 * left to use or cancel it). If the payments service cannot be reached the deletion waits.
 */
export async function endBillingOfDeletedOrganization(organizationId: string): Promise<void> {
  const account = await findBillingAccount(organizationId);
  if (!hasLiveSubscription(account)) return;
  await callPayments(() => payments.subscriptions.cancel(account.subscriptionId));
}
