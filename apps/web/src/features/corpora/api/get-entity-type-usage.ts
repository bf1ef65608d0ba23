import type { EntityTypeInUse } from "@tagloom/contracts";
import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { corpusKey } from "./keys";

export const getEntityTypeUsage = (orgId: string, corpusId: string, typeId: string) =>
  api.get<EntityTypeInUse>(`/orgs/${orgId}/corpora/${corpusId}/entity-types/${typeId}/usage`);

export const entityTypeUsageQueryOptions = (orgId: string, corpusId: string, typeId: string) =>
  queryOptions({ queryKey: [...corpusKey(orgId, corpusId), "entity-types", typeId, "usage"], queryFn: () => getEntityTypeUsage(orgId, corpusId, typeId), staleTime: 0 });

/** How many spans a type has everywhere, shown before it is deleted. */
export function useEntityTypeUsage(orgId: string, corpusId: string, typeId: string | null) {
  return useQuery({ ...entityTypeUsageQueryOptions(orgId, corpusId, typeId ?? ""), enabled: typeId !== null });
}
