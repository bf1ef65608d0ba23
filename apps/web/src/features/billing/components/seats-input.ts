import { MAX_SEATS } from "@tagloom/contracts";
import { ApiError } from "@/lib/api-client";

/** The seat count typed into a form, or the reason it cannot be used. */
export function readSeats(text: string, minimum: number, reasonBelow: string): { seats: number } | { error: string } {
  const n = Number(text);
  if (!text.trim() || !Number.isInteger(n)) return { error: "Enter a whole number of seats." };
  if (n > MAX_SEATS) return { error: `At most ${MAX_SEATS} seats.` };
  if (n < minimum) return { error: reasonBelow };
  return { seats: n };
}

/**
 * Where a refused seat change is shown: beside the Seats field when the answer is about the
 * number (the API names the `seats` field), otherwise for the whole form, so that a payments
 * outage or a lost connection is not read as a wrong number.
 */
export function placeSeatsError(err: Error): { field: string } | { form: string } {
  return err instanceof ApiError && err.fieldErrors.seats?.length ? { field: err.message } : { form: err.message };
}
