import type { AuditEvent, Page } from "@tagloom/contracts";
import { infiniteQueryOptions, useInfiniteQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";

export type AuditFilters = { action?: string; actor?: string; from?: string; to?: string };

export const getAudit = (orgId: string, filters: AuditFilters, cursor?: string) =>
  api.get<Page<AuditEvent> & { actions: string[] }>(`/orgs/${orgId}/audit`, { query: { ...filters, cursor, limit: 50 } });

export const auditQueryOptions = (orgId: string, filters: AuditFilters) =>
  infiniteQueryOptions({
    queryKey: ["orgs", orgId, "audit", filters],
    queryFn: ({ pageParam }) => getAudit(orgId, filters, pageParam),
    initialPageParam: undefined as string | undefined,
    getNextPageParam: (last) => last.nextCursor ?? undefined,
  });

export function useAudit(orgId: string, filters: AuditFilters) {
  return useInfiniteQuery(auditQueryOptions(orgId, filters));
}
