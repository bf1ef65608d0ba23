import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { corpusKey } from "./keys";
import { ownErrorMeta } from "@/lib/query-client";

export const deleteEntityType = (orgId: string, corpusId: string, typeId: string, confirm: boolean) =>
  api.delete<void>(`/orgs/${orgId}/corpora/${corpusId}/entity-types/${typeId}`, { body: { confirm } });

/** Deletes a type; with spans it must be confirmed (the API answers 409 with the count otherwise). */
export function useDeleteEntityType(orgId: string, corpusId: string) {
  const qc = useQueryClient();
  return useMutation({
    meta: ownErrorMeta,
    mutationFn: ({ typeId, confirm }: { typeId: string; confirm: boolean }) => deleteEntityType(orgId, corpusId, typeId, confirm),
    onSettled: () => qc.invalidateQueries({ queryKey: corpusKey(orgId, corpusId) }),
  });
}
