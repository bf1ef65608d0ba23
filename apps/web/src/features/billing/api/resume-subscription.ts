import type { BillingState } from "@tagloom/contracts";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { billingQueryKey } from "./get-billing";
import { ownErrorMeta } from "@/lib/query-client";

export function useResumeSubscription(orgId: string) {
  const qc = useQueryClient();
  return useMutation({
    meta: ownErrorMeta,
    mutationFn: () => api.post<BillingState>(`/orgs/${orgId}/billing/resume`),
    onSuccess: (state) => qc.setQueryData(billingQueryKey(orgId), state),
    onSettled: () => qc.invalidateQueries({ queryKey: billingQueryKey(orgId) }),
  });
}
