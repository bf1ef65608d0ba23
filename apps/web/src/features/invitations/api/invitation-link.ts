import type { InvitationPreview } from "@tagloom/contracts";
import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { ownErrorMeta } from "@/lib/query-client";

export const getInvitationPreview = (token: string) => api.get<InvitationPreview>(`/invitations/${encodeURIComponent(token)}`);
export const acceptInvitation = (token: string) => api.post<{ organizationId: string }>(`/invitations/${encodeURIComponent(token)}/accept`);

export const invitationPreviewQueryOptions = (token: string) =>
  queryOptions({ queryKey: ["invitation-link", token], queryFn: () => getInvitationPreview(token) });

export function useInvitationPreview(token: string) {
  return useQuery(invitationPreviewQueryOptions(token));
}

export function useAcceptInvitation() {
  const qc = useQueryClient();
  return useMutation({ meta: ownErrorMeta, mutationFn: acceptInvitation, onSuccess: () => qc.invalidateQueries({ queryKey: ["me"] }) });
}
