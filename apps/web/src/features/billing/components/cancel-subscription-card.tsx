import type { BillingState } from "@tagloom/contracts";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Card, Notice } from "@/components/ui/card";
import { useCancelSubscription } from "../api/cancel-subscription";
import { useResumeSubscription } from "../api/resume-subscription";
import { formatDay } from "./format-billing";

/** Ends the paid plan at the end of the period (or takes that back before it ends). */
export function CancelSubscriptionCard({ orgId, state }: { orgId: string; state: BillingState }) {
  const cancel = useCancelSubscription(orgId);
  const resume = useResumeSubscription(orgId);
  const [confirming, setConfirming] = useState(false);
  const sub = state.subscription;
  if (!sub) return null;
  const end = formatDay(sub.currentPeriodEnd);
  const error = cancel.error ?? resume.error;
  return (
    <Card>
      <h2 className="font-semibold text-ink-900">{sub.cancelAtPeriodEnd ? "The paid plan ends soon" : "Stop paying"}</h2>
      {error ? <Notice tone="error" className="mt-3">{error.message}</Notice> : null}
      {sub.cancelAtPeriodEnd ? (
        <div className="mt-2 flex flex-wrap items-center gap-3">
          <p className="flex-1 text-sm text-ink-700">
            The subscription ends on {end}. Then the free plan's {state.freeSeats} seats apply; with more members and invitations than that, nobody new
            can be invited.
          </p>
          <Button variant="secondary" busy={resume.isPending} onClick={() => resume.mutate()}>
            Keep paying per seat
          </Button>
        </div>
      ) : confirming ? (
        <div className="mt-2 flex flex-wrap items-center gap-3">
          <p className="flex-1 text-sm text-ink-700">Cancel at the end of the period ({end})? Nothing is refunded; seats stay until then.</p>
          <Button variant="danger" busy={cancel.isPending} onClick={() => cancel.mutate(undefined, { onSettled: () => setConfirming(false) })}>
            Yes, cancel on {end}
          </Button>
          <Button variant="ghost" onClick={() => setConfirming(false)}>
            No
          </Button>
        </div>
      ) : (
        <div className="mt-2 flex flex-wrap items-center gap-3">
          <p className="flex-1 text-sm text-ink-700">You can cancel at any time; the seats you paid for stay until the end of the period.</p>
          <Button variant="secondary" onClick={() => setConfirming(true)}>
            Cancel at period end
          </Button>
        </div>
      )}
    </Card>
  );
}
