import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { ownErrorMeta } from "@/lib/query-client";

type OrgSummary = { id: string; name: string; role: string };

export function useCreateOrganization() {
  const qc = useQueryClient();
  return useMutation({
    meta: ownErrorMeta,
    mutationFn: (name: string) => api.post<OrgSummary>("/orgs", { name }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ["me"] }),
  });
}

export function useRenameOrganization(orgId: string) {
  const qc = useQueryClient();
  return useMutation({
    meta: ownErrorMeta,
    mutationFn: (name: string) => api.patch<OrgSummary>(`/orgs/${orgId}`, { name }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ["me"] }),
  });
}

export function useDeleteOrganization(orgId: string) {
  const qc = useQueryClient();
  return useMutation({
    meta: ownErrorMeta,
    mutationFn: (confirmName: string) => api.delete<void>(`/orgs/${orgId}`, { body: { confirmName } }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ["me"] }),
  });
}
