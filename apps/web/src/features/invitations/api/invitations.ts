import type { CreateInvitationInput, Invitation, Page } from "@tagloom/contracts";
import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { ownErrorMeta } from "@/lib/query-client";

export const invitationsQueryOptions = (orgId: string) =>
  queryOptions({ queryKey: ["orgs", orgId, "invitations"], queryFn: () => api.get<Page<Invitation>>(`/orgs/${orgId}/invitations`) });

export function useInvitations(orgId: string, enabled = true) {
  return useQuery({ ...invitationsQueryOptions(orgId), enabled });
}

function useInvalidate(orgId: string) {
  const qc = useQueryClient();
  return () => qc.invalidateQueries({ queryKey: ["orgs", orgId, "invitations"] });
}

export function useCreateInvitation(orgId: string) {
  const onSettled = useInvalidate(orgId);
  return useMutation({ meta: ownErrorMeta, mutationFn: (input: CreateInvitationInput) => api.post<Invitation>(`/orgs/${orgId}/invitations`, input), onSettled });
}

export function useResendInvitation(orgId: string) {
  const onSettled = useInvalidate(orgId);
  return useMutation({ meta: ownErrorMeta, mutationFn: (id: string) => api.post<Invitation>(`/orgs/${orgId}/invitations/${id}/resend`), onSettled });
}

export function useRevokeInvitation(orgId: string) {
  const onSettled = useInvalidate(orgId);
  return useMutation({ meta: ownErrorMeta, mutationFn: (id: string) => api.delete<void>(`/orgs/${orgId}/invitations/${id}`), onSettled });
}
