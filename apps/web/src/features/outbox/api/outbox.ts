import type { AppMeta, OutboxMessage } from "@tagloom/contracts";
import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";

export const metaQueryOptions = () => queryOptions({ queryKey: ["meta"], queryFn: () => api.get<AppMeta>("/meta"), staleTime: Infinity });
export function useAppMeta() {
  return useQuery(metaQueryOptions());
}

export const outboxQueryOptions = () =>
  queryOptions({ queryKey: ["outbox"], queryFn: () => api.get<{ items: OutboxMessage[] }>("/dev/outbox"), refetchInterval: 3000 });
export function useOutbox(enabled: boolean) {
  return useQuery({ ...outboxQueryOptions(), enabled });
}
