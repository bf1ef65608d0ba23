import type { CreateEntityTypeInput, EntityType } from "@tagloom/contracts";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { corpusKey } from "./keys";
import { ownErrorMeta } from "@/lib/query-client";

export const createEntityType = (orgId: string, corpusId: string, input: CreateEntityTypeInput) =>
  api.post<EntityType>(`/orgs/${orgId}/corpora/${corpusId}/entity-types`, input);

export function useCreateEntityType(orgId: string, corpusId: string) {
  const qc = useQueryClient();
  return useMutation({
    meta: ownErrorMeta,
    mutationFn: (input: CreateEntityTypeInput) => createEntityType(orgId, corpusId, input),
    onSettled: () => qc.invalidateQueries({ queryKey: corpusKey(orgId, corpusId) }),
  });
}
