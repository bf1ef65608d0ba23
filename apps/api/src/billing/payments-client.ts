import Stripe from "stripe";
import { env } from "@/config/env";
import { AppError } from "@/errors";

/**
 * The official payments SDK, pointed at STRIPE_API_HOST/PORT/PROTOCOL (the local fake by
 * default). No retries inside a request: a payments service that is down is reported at once and
 * the caller's transaction rolls back.
 */
export const payments = new Stripe(env.STRIPE_SECRET_KEY, {
  host: env.STRIPE_API_HOST,
  port: env.STRIPE_API_PORT,
  protocol: env.STRIPE_API_PROTOCOL,
  maxNetworkRetries: 0,
  timeout: 15_000,
  telemetry: false,
});

export class PaymentsUnavailableError extends AppError {
  constructor() {
    super(503, "payments_unavailable", "The payments service cannot be reached right now. Nothing was changed; try again in a minute.");
  }
}

export class PaymentDeclinedError extends AppError {
  constructor(reason: string) {
    super(402, "payment_declined", `The payment was declined: ${reason}`);
  }
}

/** Runs a call to the payments service and turns its failures into our errors. */
export async function callPayments<T>(call: () => Promise<T>): Promise<T> {
  try {
    return await call();
  } catch (err) {
    if (err instanceof Stripe.errors.StripeCardError) throw new PaymentDeclinedError(err.message);
    if (err instanceof Stripe.errors.StripeError) {
      if (err instanceof Stripe.errors.StripeConnectionError || err instanceof Stripe.errors.StripeAPIError || (err.statusCode ?? 0) >= 500) throw new PaymentsUnavailableError();
      throw new AppError(502, "payments_error", "The payments service refused the request. Nothing was changed.", { reason: err.message });
    }
    throw err;
  }
}
