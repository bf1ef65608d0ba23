import type { Queue } from "@tagloom/contracts";
import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";

export const getQueue = (orgId: string) => api.get<Queue>(`/orgs/${orgId}/queue`);

export const queueQueryOptions = (orgId: string) =>
  queryOptions({ queryKey: ["orgs", orgId, "queue"], queryFn: () => getQueue(orgId), staleTime: 0 });

export function useQueue(orgId: string) {
  return useQuery(queueQueryOptions(orgId));
}
