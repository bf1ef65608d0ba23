import { describe, expect, it } from "vitest";
import type { BillingAccountRow } from "./billing.repository";
import { hasLiveSubscription, seatLimitOf } from "./seats";

// The provider's documented subscription states (common practice): active and trialing are in
// force; past_due and unpaid keep what was paid for until the period ends; canceled is over.
const now = new Date("2026-12-02T12:00:00Z");
const later = new Date("2027-01-01T12:00:00Z");
const earlier = new Date("2026-11-30T12:00:00Z");
const account = (over: Partial<BillingAccountRow>): BillingAccountRow => ({
  organizationId: "o",
  customerId: "cus_1",
  subscriptionId: "sub_1",
  subscriptionItemId: "si_1",
  subscriptionStatus: "active",
  paidSeats: 12,
  cancelAtPeriodEnd: false,
  currentPeriodEnd: later,
  seatPrice: 900,
  currency: "eur",
  ...over,
});

describe("seatLimitOf", () => {
  it.each([
    ["no account", null, "free", 5],
    ["customer without subscription", account({ subscriptionId: null, subscriptionStatus: null }), "free", 5],
    ["active", account({}), "per_seat", 12],
    ["active, cancelling at a period end still ahead", account({ cancelAtPeriodEnd: true }), "per_seat", 12],
    ["active, cancelled and the period is over", account({ cancelAtPeriodEnd: true, currentPeriodEnd: earlier }), "free", 5],
    ["past due inside the paid period", account({ subscriptionStatus: "past_due" }), "per_seat", 12],
    ["past due after the paid period", account({ subscriptionStatus: "past_due", currentPeriodEnd: earlier }), "free", 5],
    ["canceled", account({ subscriptionStatus: "canceled" }), "free", 5],
    ["incomplete", account({ subscriptionStatus: "incomplete" }), "free", 5],
  ] as const)("%s", (_label, a, plan, seatLimit) => {
    expect(seatLimitOf(a, 5, now)).toEqual({ plan, seatLimit });
  });

  it("only live subscriptions can be changed", () => {
    expect(hasLiveSubscription(account({}))).toBe(true);
    expect(hasLiveSubscription(account({ subscriptionStatus: "past_due" }))).toBe(true);
    expect(hasLiveSubscription(account({ subscriptionStatus: "canceled" }))).toBe(false);
    expect(hasLiveSubscription(null)).toBe(false);
  });
});
