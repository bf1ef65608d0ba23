import type { EntityType, UpdateEntityTypeInput } from "@tagloom/contracts";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { corpusKey } from "./keys";
import { ownErrorMeta } from "@/lib/query-client";

export const updateEntityType = (orgId: string, corpusId: string, typeId: string, input: UpdateEntityTypeInput) =>
  api.patch<EntityType>(`/orgs/${orgId}/corpora/${corpusId}/entity-types/${typeId}`, input);

/** Renames (spans are kept), recolours, re-keys, reorders or re-describes a type. */
export function useUpdateEntityType(orgId: string, corpusId: string) {
  const qc = useQueryClient();
  return useMutation({
    meta: ownErrorMeta,
    mutationFn: ({ typeId, input }: { typeId: string; input: UpdateEntityTypeInput }) => updateEntityType(orgId, corpusId, typeId, input),
    onSettled: () => qc.invalidateQueries({ queryKey: corpusKey(orgId, corpusId) }),
  });
}
