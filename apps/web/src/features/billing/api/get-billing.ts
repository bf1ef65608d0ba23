import type { BillingState } from "@tagloom/contracts";
import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";

export const billingQueryKey = (orgId: string) => ["orgs", orgId, "billing"] as const;

export const billingQueryOptions = (orgId: string) =>
  queryOptions({ queryKey: billingQueryKey(orgId), queryFn: () => api.get<BillingState>(`/orgs/${orgId}/billing`) });

/**
 * The organization's plan, seats and invoices. While a checkout waits for the payments service's
 * confirmation (or the page was just reached from the checkout page) it polls every 2 s.
 */
export function useBilling(orgId: string, { waitingForCheckout = false }: { waitingForCheckout?: boolean } = {}) {
  return useQuery({
    ...billingQueryOptions(orgId),
    refetchInterval: (q) => (q.state.data?.checkoutPending || (waitingForCheckout && q.state.data?.plan === "free") ? 2000 : false),
  });
}
