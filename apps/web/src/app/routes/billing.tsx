import { can } from "@tagloom/contracts";
import { useSearchParams } from "react-router";
import { EmptyState, Notice, PageHeader, Skeleton } from "@/components/ui/card";
import { useBilling } from "@/features/billing/api/get-billing";
import { BuySeatsForm } from "@/features/billing/components/buy-seats-form";
import { CancelSubscriptionCard } from "@/features/billing/components/cancel-subscription-card";
import { ChangeSeatsForm } from "@/features/billing/components/change-seats-form";
import { InvoicesTable } from "@/features/billing/components/invoices-table";
import { PaymentFailedBanner } from "@/features/billing/components/payment-failed-banner";
import { SeatSummary } from "@/features/billing/components/seat-summary";
import { useCurrentOrg } from "@/features/orgs/hooks/use-current-org";

export function BillingRoute() {
  const org = useCurrentOrg();
  if (!can(org.role, "manageBilling")) {
    return (
      <div className="max-w-3xl">
        <PageHeader title="Billing" />
        <Notice>Only admins see seats and billing. Ask an admin of {org.organizationName} if you need more seats.</Notice>
      </div>
    );
  }
  return <BillingScreen orgId={org.organizationId} organizationName={org.organizationName} />;
}

function BillingScreen({ orgId, organizationName }: { orgId: string; organizationName: string }) {
  const [params] = useSearchParams();
  // Coming back from the checkout page proves nothing: the page waits for the payments service.
  const returned = params.get("checkout") === "returned";
  const billing = useBilling(orgId, { waitingForCheckout: returned });
  const state = billing.data;
  const live = state?.subscription && state.subscription.status !== "canceled" && state.plan === "per_seat";
  return (
    <div className="max-w-5xl space-y-6">
      <PageHeader title="Billing" subtitle={`Seats and invoices of ${organizationName}.`} />
      {billing.isPending ? (
        <Skeleton />
      ) : billing.isError ? (
        <Notice tone="error">{billing.error.message}</Notice>
      ) : state ? (
        <>
          {state.paymentFailed ? <PaymentFailedBanner orgId={orgId} state={state} /> : null}
          {returned && state.plan === "free" ? (
            <Notice>Waiting for the payments service to confirm the payment. Your seats change here as soon as it does.</Notice>
          ) : null}
          {params.get("checkout") === "cancelled" && state.plan === "free" ? <Notice>The checkout was left without paying; nothing changed.</Notice> : null}
          <SeatSummary state={state} />
          {live ? (
            <div className="grid gap-6 lg:grid-cols-2">
              <ChangeSeatsForm key={state.subscription?.seats} orgId={orgId} state={state} />
              <CancelSubscriptionCard orgId={orgId} state={state} />
            </div>
          ) : (
            <BuySeatsForm orgId={orgId} state={state} />
          )}
          <section className="space-y-3">
            <h2 className="font-semibold text-ink-900">Invoices</h2>
            {state.invoices.length ? (
              <InvoicesTable invoices={state.invoices} />
            ) : (
              <EmptyState title="No invoices yet">Invoices appear here once you pay for seats.</EmptyState>
            )}
          </section>
        </>
      ) : null}
    </div>
  );
}
