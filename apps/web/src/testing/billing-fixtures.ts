import type { BillingState } from "@tagloom/contracts";

/** A free-plan organization with two members and no subscription (the component tests' starting state). */
export const freeBillingState: BillingState = {
  plan: "free",
  freeSeats: 5,
  seatLimit: 5,
  seatsUsed: 2,
  members: 2,
  pendingInvitations: 0,
  subscription: null,
  nextInvoiceAt: null,
  paymentFailed: false,
  checkoutPending: false,
  invoices: [],
};
