import type { BillingPlan } from "@tagloom/contracts";
import type { BillingAccountRow } from "./billing.repository";

/** Subscription states in which the paid seats are in force (past due: until the period ends). */
const PAID_STATES = new Set(["active", "trialing"]);
const GRACE_STATES = new Set(["past_due", "unpaid"]);

/**
 * The plan and seat limit of an organization at `now`: the paid quantity while the subscription
 * is in force, the free plan's seats otherwise. A declined renewal keeps the seats until the end
 * of the period that was paid for; a cancellation at period end keeps them until then.
 */
export function seatLimitOf(account: BillingAccountRow | null, freeSeats: number, now = new Date()): { plan: BillingPlan; seatLimit: number } {
  const status = account?.subscriptionStatus;
  if (!account || !account.subscriptionId || !status) return { plan: "free", seatLimit: freeSeats };
  const periodOpen = account.currentPeriodEnd !== null && account.currentPeriodEnd.getTime() > now.getTime();
  const inForce = (PAID_STATES.has(status) && (periodOpen || !account.cancelAtPeriodEnd)) || (GRACE_STATES.has(status) && periodOpen);
  return inForce ? { plan: "per_seat", seatLimit: account.paidSeats } : { plan: "free", seatLimit: freeSeats };
}

/** True while the subscription can still be changed (seats, cancellation) through the payments service. */
export function hasLiveSubscription(account: BillingAccountRow | null): account is BillingAccountRow & { subscriptionId: string } {
  const status = account?.subscriptionStatus;
  return Boolean(account?.subscriptionId) && status !== undefined && status !== null && (PAID_STATES.has(status) || GRACE_STATES.has(status));
}
