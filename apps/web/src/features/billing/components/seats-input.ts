import { MAX_SEATS } from "@tagloom/contracts";

/** The seat count typed into a form, or the reason it cannot be used. */
export function readSeats(text: string, minimum: number, reasonBelow: string): { seats: number } | { error: string } {
  const n = Number(text);
  if (!text.trim() || !Number.isInteger(n)) return { error: "Enter a whole number of seats." };
  if (n > MAX_SEATS) return { error: `At most ${MAX_SEATS} seats.` };
  if (n < minimum) return { error: reasonBelow };
  return { seats: n };
}
