import type { EntityType } from "@tagloom/contracts";
import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { corpusKey } from "./keys";

export const getEntityTypes = (orgId: string, corpusId: string) =>
  api.get<{ items: EntityType[] }>(`/orgs/${orgId}/corpora/${corpusId}/entity-types`).then((r) => r.items);

export const entityTypesQueryOptions = (orgId: string, corpusId: string) =>
  queryOptions({ queryKey: [...corpusKey(orgId, corpusId), "entity-types"], queryFn: () => getEntityTypes(orgId, corpusId) });

export function useEntityTypes(orgId: string, corpusId: string) {
  return useQuery(entityTypesQueryOptions(orgId, corpusId));
}
