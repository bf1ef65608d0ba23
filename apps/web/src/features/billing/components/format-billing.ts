/** An amount in minor units as money: 54.00 EUR → "€54.00". */
export function formatMoney(minor: number, currency: string): string {
  try {
    return new Intl.NumberFormat("en", { style: "currency", currency: currency.toUpperCase() }).format(minor / 100);
  } catch {
    return `${(minor / 100).toFixed(2)} ${currency.toUpperCase()}`;
  }
}

/** A date as "2 Jan 2027". */
export function formatDay(isoText: string | null): string {
  if (!isoText) return "—";
  return new Date(isoText).toLocaleDateString("en-GB", { day: "numeric", month: "short", year: "numeric" });
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
