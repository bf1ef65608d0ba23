import type { TrainingRun } from "@tagloom/contracts";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { corpusApi, runsKey } from "./keys";
import { ownErrorMeta } from "@/lib/query-client";

export function useCancelRun(orgId: string, corpusId: string, runId: string) {
  const qc = useQueryClient();
  return useMutation({
    meta: ownErrorMeta,
    mutationFn: () => api.post<TrainingRun>(`${corpusApi(orgId, corpusId)}/runs/${runId}/cancel`),
    onSuccess: (run) => qc.setQueryData([...runsKey(orgId, corpusId), runId], run),
    onSettled: () => qc.invalidateQueries({ queryKey: runsKey(orgId, corpusId) }),
  });
}
