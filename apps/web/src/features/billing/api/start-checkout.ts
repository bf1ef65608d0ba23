import type { CheckoutStarted } from "@tagloom/contracts";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { billingQueryKey } from "./get-billing";
import { ownErrorMeta } from "@/lib/query-client";

export function useStartCheckout(orgId: string) {
  const qc = useQueryClient();
  return useMutation({
    meta: ownErrorMeta,
    mutationFn: (seats: number) => api.post<CheckoutStarted>(`/orgs/${orgId}/billing/checkout`, { seats }),
    onSettled: () => qc.invalidateQueries({ queryKey: billingQueryKey(orgId) }),
  });
}
