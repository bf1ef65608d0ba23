import { z } from "zod";

export const billingPlans = ["free", "per_seat"] as const;
export type BillingPlan = (typeof billingPlans)[number];

/** Seats one checkout or seat change may ask for (a sanity bound, not a price rule). */
export const MAX_SEATS = 1000;

const seatsField = z
  .number({ error: "Enter a whole number of seats." })
  .int("Enter a whole number of seats.")
  .min(1, "At least 1 seat.")
  .max(MAX_SEATS, `At most ${MAX_SEATS} seats.`);

export const startCheckoutInputSchema = z.object({ seats: seatsField });
export type StartCheckoutInput = z.infer<typeof startCheckoutInputSchema>;

export const changeSeatsInputSchema = z.object({ seats: seatsField });
export type ChangeSeatsInput = z.infer<typeof changeSeatsInputSchema>;

export type CheckoutStarted = { checkoutId: string; url: string };

export type BillingInvoice = {
  id: string;
  number: string | null;
  status: string;
  amountDue: number;
  amountPaid: number;
  currency: string;
  periodStart: string | null;
  periodEnd: string | null;
  createdAt: string;
};

export type BillingSubscription = {
  status: string;
  seats: number;
  cancelAtPeriodEnd: boolean;
  currentPeriodEnd: string | null;
  /** Price of one seat a month in minor units (cents), with its currency. */
  seatPrice: number | null;
  currency: string | null;
};

/** GET /api/orgs/:orgId/billing (admins). */
export type BillingState = {
  plan: BillingPlan;
  /** Seats the free plan includes. */
  freeSeats: number;
  /** Seats the organization may use now (free seats, or the paid quantity while it is in force). */
  seatLimit: number;
  /** Members plus pending invitations. */
  seatsUsed: number;
  members: number;
  pendingInvitations: number;
  subscription: BillingSubscription | null;
  /** When the next invoice is due (end of the current period), if one will come. */
  nextInvoiceAt: string | null;
  /** The last charge was declined; seats stay until the period ends. */
  paymentFailed: boolean;
  /** A checkout was started and its payment is not confirmed by the payments service yet. */
  checkoutPending: boolean;
  invoices: BillingInvoice[];
};

/** Details of the 402 `seat_limit_reached` refusal when an invitation needs a seat that is not there. */
export type SeatLimitDetails = { seatsUsed: number; seatLimit: number; plan: BillingPlan };
