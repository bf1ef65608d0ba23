import type Stripe from "stripe";
import type { InvoiceRow, SubscriptionState } from "./billing.repository";
import { payments } from "./payments-client";

const fromUnix = (s: number | null | undefined): Date | null => (typeof s === "number" ? new Date(s * 1000) : null);

/** Our copy of a subscription as the payments service reports it (one seat item). */
export function toSubscriptionState(sub: Stripe.Subscription): SubscriptionState {
  const item = sub.items.data[0];
  return {
    subscriptionId: sub.id,
    subscriptionItemId: item?.id ?? null,
    subscriptionStatus: sub.status,
    paidSeats: item?.quantity ?? 0,
    cancelAtPeriodEnd: sub.cancel_at_period_end,
    currentPeriodEnd: fromUnix(item?.current_period_end),
    seatPrice: item?.price.unit_amount ?? null,
    currency: item?.price.currency ?? null,
  };
}

export function toInvoiceRow(inv: Stripe.Invoice): InvoiceRow | null {
  if (!inv.id) return null;
  const sub = inv.parent?.subscription_details?.subscription;
  return {
    id: inv.id,
    subscriptionId: typeof sub === "string" ? sub : (sub?.id ?? null),
    number: inv.number ?? null,
    status: inv.status ?? "draft",
    amountDue: inv.amount_due,
    amountPaid: inv.amount_paid,
    currency: inv.currency,
    periodStart: fromUnix(inv.period_start),
    periodEnd: fromUnix(inv.period_end),
    issuedAt: fromUnix(inv.created) ?? new Date(),
  };
}

/** The customer's latest invoices, fetched from the payments service (the source of truth). */
export async function fetchInvoices(customerId: string): Promise<InvoiceRow[]> {
  const list = await payments.invoices.list({ customer: customerId, limit: 24 });
  return list.data.map(toInvoiceRow).filter((i): i is InvoiceRow => i !== null);
}
