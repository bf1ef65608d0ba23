import { formatDate } from "@/lib/dates";

/** An amount in minor units as money: 54.00 EUR → "€54.00". */
export function formatMoney(minor: number, currency: string): string {
  try {
    return new Intl.NumberFormat("en", { style: "currency", currency: currency.toUpperCase() }).format(minor / 100);
  } catch {
    return `${(minor / 100).toFixed(2)} ${currency.toUpperCase()}`;
  }
}

/** A date in the app's one date format (the browser's locale), "—" when there is none. */
export function formatDay(isoText: string | null): string {
  if (!isoText) return "—";
  return formatDate(isoText);
}

const statusLabels: Record<string, string> = {
  active: "Active",
  trialing: "Trial",
  past_due: "Payment overdue",
  unpaid: "Unpaid",
  canceled: "Ended",
  incomplete: "Awaiting first payment",
  incomplete_expired: "Never started",
  paused: "Paused",
};
export const subscriptionStatusLabel = (s: string) => statusLabels[s] ?? s;

const invoiceLabels: Record<string, string> = { paid: "Paid", open: "Unpaid", draft: "Draft", void: "Voided", uncollectible: "Written off" };
export const invoiceStatusLabel = (s: string) => invoiceLabels[s] ?? s;

/** "1 member", "3 members". */
export const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;
