import type { BillingState } from "@tagloom/contracts";
import { Button } from "@/components/ui/button";
import { useToast } from "@/components/ui/toaster";
import { useRetryPayment } from "../api/retry-payment";
import { formatDay } from "./format-billing";

/** Shown while the last charge was declined: seats stay until the paid period ends. */
export function PaymentFailedBanner({ orgId, state }: { orgId: string; state: BillingState }) {
  const retry = useRetryPayment(orgId);
  const toast = useToast();
  return (
    <div role="alert" className="flex flex-wrap items-center gap-4 rounded-md border border-rust-500/40 bg-rust-500/10 px-4 py-3 text-sm text-ink-900">
      <div className="min-w-0 flex-1">
        <p className="font-semibold text-rust-500">The last payment was declined.</p>
        <p>
          Your {state.subscription?.seats ?? state.seatLimit} seats stay until {formatDay(state.subscription?.currentPeriodEnd ?? null)}. After that the
          organization falls back to the free plan's {state.freeSeats} seats unless the invoice is paid.
        </p>
        {retry.isError ? <p className="mt-1 font-medium text-rust-500">{retry.error.message}</p> : null}
      </div>
      <Button variant="danger" busy={retry.isPending} onClick={() => retry.mutate(undefined, { onSuccess: () => toast.show("Payment received. Thank you.", "success") })}>
        Retry the payment
      </Button>
    </div>
  );
}
