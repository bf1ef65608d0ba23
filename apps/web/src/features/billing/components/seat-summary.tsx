import type { BillingState } from "@tagloom/contracts";
import { Card } from "@/components/ui/card";
import { cn } from "@/lib/cn";
import { formatDay, formatMoney, plural, subscriptionStatusLabel } from "./format-billing";

/** Plan, seats used against the limit, and when the next invoice comes. */
export function SeatSummary({ state }: { state: BillingState }) {
  const share = state.seatLimit > 0 ? Math.min(1, state.seatsUsed / state.seatLimit) : 1;
  const full = state.seatsUsed >= state.seatLimit;
  const sub = state.subscription;
  const paid = state.plan === "per_seat";
  return (
    <Card className="grid gap-6 sm:grid-cols-3">
      <div>
        <p className="text-xs font-semibold tracking-wide text-ink-500 uppercase">Plan</p>
        <p className="mt-1 text-lg font-semibold text-ink-900">{paid ? "Per seat" : "Free"}</p>
        <p className="text-sm text-ink-700">
          {paid && sub?.seatPrice != null && sub.currency
            ? `${formatMoney(sub.seatPrice, sub.currency)} per seat a month · ${subscriptionStatusLabel(sub.status)}`
            : `Up to ${state.freeSeats} seats at no charge`}
        </p>
      </div>
      <div>
        <p className="text-xs font-semibold tracking-wide text-ink-500 uppercase">Seats</p>
        <p className="mt-1 text-lg font-semibold text-ink-900">
          {state.seatsUsed} used of {state.seatLimit} {paid ? "paid" : "free"}
        </p>
        <div className="mt-2 h-2 overflow-hidden rounded-full bg-ink-100" aria-hidden>
          <div className={cn("h-full rounded-full", full ? "bg-thread-500" : "bg-moss-500")} style={{ width: `${share * 100}%` }} />
        </div>
        <p className="mt-1 text-sm text-ink-700">
          {plural(state.members, "member", "members")} · {plural(state.pendingInvitations, "pending invitation", "pending invitations")}
        </p>
      </div>
      <div>
        <p className="text-xs font-semibold tracking-wide text-ink-500 uppercase">Next invoice</p>
        <p className="mt-1 text-lg font-semibold text-ink-900">{state.nextInvoiceAt ? formatDay(state.nextInvoiceAt) : "None"}</p>
        <p className="text-sm text-ink-700">
          {sub?.cancelAtPeriodEnd && sub.currentPeriodEnd
            ? `Ends on ${formatDay(sub.currentPeriodEnd)}; back to the free plan after that.`
            : state.nextInvoiceAt && sub?.seatPrice != null && sub.currency
              ? `${formatMoney(sub.seatPrice * sub.seats, sub.currency)} for ${sub.seats} seats`
              : "The free plan is never invoiced."}
        </p>
      </div>
    </Card>
  );
}
