import type { Member, Page, Role } from "@tagloom/contracts";
import { infiniteQueryOptions, useInfiniteQuery, useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { ownErrorMeta } from "@/lib/query-client";

export const getMembers = (orgId: string, cursor?: string) =>
  api.get<Page<Member>>(`/orgs/${orgId}/members`, { query: { cursor, limit: 100 } });

export const membersQueryOptions = (orgId: string) =>
  infiniteQueryOptions({
    queryKey: ["orgs", orgId, "members"],
    queryFn: ({ pageParam }) => getMembers(orgId, pageParam),
    initialPageParam: undefined as string | undefined,
    getNextPageParam: (last) => last.nextCursor ?? undefined,
  });

export function useMembers(orgId: string) {
  return useInfiniteQuery(membersQueryOptions(orgId));
}

export function useChangeMemberRole(orgId: string) {
  const qc = useQueryClient();
  return useMutation({
    meta: ownErrorMeta,
    mutationFn: ({ userId, role }: { userId: string; role: Role }) => api.patch<Member>(`/orgs/${orgId}/members/${userId}`, { role }),
    onSettled: () => qc.invalidateQueries({ queryKey: ["orgs", orgId, "members"] }),
  });
}

export function useRemoveMember(orgId: string) {
  const qc = useQueryClient();
  return useMutation({
    meta: ownErrorMeta,
    mutationFn: (userId: string) => api.delete<void>(`/orgs/${orgId}/members/${userId}`),
    onSettled: () => qc.invalidateQueries({ queryKey: ["orgs", orgId, "members"] }),
  });
}
