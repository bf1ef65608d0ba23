import type Stripe from "stripe";
import { type Actor, recordAudit } from "@/audit/audit.service";
import { env } from "@/config/env";
import { db } from "@/db/knex";
import { AppError } from "@/errors";
import {
  findBillingAccountByCustomer,
  isWebhookEventHandled,
  markCheckoutComplete,
  recordWebhookEvent,
  saveSubscriptionState,
  upsertInvoices,
} from "./billing.repository";
import { callPayments, payments } from "./payments-client";
import { fetchInvoices, toSubscriptionState } from "./provider-state";

const SYSTEM: Actor = { userId: null, email: "payments service", ip: null };

export type WebhookResult = { received: true; duplicate?: true; ignored?: true };

const idOf = (v: string | { id: string } | null | undefined): string | null => (typeof v === "string" ? v : (v?.id ?? null));

/** What an event is about: whose customer, and which subscription and checkout to look up. */
function subjectOf(event: Stripe.Event): { customerId: string | null; subscriptionId: string | null; checkoutId: string | null } | null {
  switch (event.type) {
    case "checkout.session.completed": {
      const s = event.data.object;
      return { customerId: idOf(s.customer), subscriptionId: idOf(s.subscription), checkoutId: s.id };
    }
    case "customer.subscription.created":
    case "customer.subscription.updated":
    case "customer.subscription.deleted": {
      const s = event.data.object;
      return { customerId: idOf(s.customer), subscriptionId: s.id, checkoutId: null };
    }
    case "invoice.paid":
    case "invoice.payment_failed": {
      const i = event.data.object;
      return { customerId: idOf(i.customer), subscriptionId: idOf(i.parent?.subscription_details?.subscription), checkoutId: null };
    }
    default:
      return null;
  }
}

/**
 * Handles one webhook delivery. The signature is checked by the SDK over the raw body (a bad one
 * answers 400 and changes nothing). An event id already handled is acknowledged and ignored. The
 * event's own snapshot is never applied: the subscription, invoices and checkout are fetched from
 * the payments service now, so deliveries arriving late or out of order all end in its current
 * state.
 */
export async function handleWebhook(rawBody: Buffer, signature: string | undefined): Promise<WebhookResult> {
  let event: Stripe.Event;
  try {
    event = payments.webhooks.constructEvent(rawBody, signature ?? "", env.STRIPE_WEBHOOK_SECRET);
  } catch {
    throw new AppError(400, "bad_signature", "The webhook signature is missing or does not match this endpoint's secret.");
  }
  if (await isWebhookEventHandled(event.id)) return { received: true, duplicate: true };

  const subject = subjectOf(event);
  const account = subject?.customerId ? await findBillingAccountByCustomer(subject.customerId) : null;
  if (!subject || !account) {
    // Not an event we act on, or a customer that is not one of ours: remember it and move on.
    await recordWebhookEvent({ id: event.id, type: event.type, organizationId: null });
    return { received: true, ignored: true };
  }

  const subscription = subject.subscriptionId ? await callPayments(() => payments.subscriptions.retrieve(subject.subscriptionId!)) : null;
  const invoices = await callPayments(() => fetchInvoices(account.customerId!));
  const checkout = subject.checkoutId ? await callPayments(() => payments.checkout.sessions.retrieve(subject.checkoutId!)) : null;
  const organizationId = account.organizationId;

  return db.transaction(async (trx): Promise<WebhookResult> => {
    // Locked first: an organization deleted meanwhile (its account goes with it) is not written to.
    const before = await findBillingAccountByCustomer(account.customerId!, trx, true);
    if (!before || before.organizationId !== organizationId) {
      const fresh = await recordWebhookEvent({ id: event.id, type: event.type, organizationId: null }, trx);
      return fresh ? { received: true, ignored: true } : { received: true, duplicate: true };
    }
    if (!(await recordWebhookEvent({ id: event.id, type: event.type, organizationId }, trx))) return { received: true, duplicate: true };
    if (subscription && idOf(subscription.customer) === account.customerId && mayReplace(before, subscription)) {
      const next = toSubscriptionState(subscription);
      await saveSubscriptionState(organizationId, next, trx);
      if (
        before.subscriptionId !== next.subscriptionId ||
        before.subscriptionStatus !== next.subscriptionStatus ||
        before.paidSeats !== next.paidSeats ||
        before.cancelAtPeriodEnd !== next.cancelAtPeriodEnd
      ) {
        await recordAudit(trx, SYSTEM, organizationId, "billing.subscription_updated", { type: "subscription", id: subscription.id }, {
          event: event.type,
          status: { from: before.subscriptionStatus, to: next.subscriptionStatus },
          seats: { from: before.paidSeats, to: next.paidSeats },
          cancelAtPeriodEnd: next.cancelAtPeriodEnd,
        });
      }
    }
    await upsertInvoices(organizationId, invoices, trx);
    if (checkout && checkout.status === "complete" && (await markCheckoutComplete(organizationId, checkout.id, trx))) {
      await recordAudit(trx, SYSTEM, organizationId, "billing.checkout_paid", { type: "checkout", id: checkout.id }, { subscription: idOf(checkout.subscription) });
    }
    return { received: true };
  });
}

/**
 * A subscription replaces our copy when it is the one we track, or when ours has ended. This
 * keeps a late event about an old, cancelled subscription from overwriting a newer live one.
 */
function mayReplace(current: { subscriptionId: string | null; subscriptionStatus: string | null }, incoming: Stripe.Subscription): boolean {
  if (!current.subscriptionId || current.subscriptionId === incoming.id) return true;
  const ended = current.subscriptionStatus === "canceled" || current.subscriptionStatus === "incomplete_expired";
  return ended;
}
