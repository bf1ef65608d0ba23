import type { StartRunInput, TrainingRun } from "@tagloom/contracts";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { corpusApi, runsKey } from "./keys";
import { ownErrorMeta } from "@/lib/query-client";

export function useStartRun(orgId: string, corpusId: string) {
  const qc = useQueryClient();
  return useMutation({
    meta: ownErrorMeta,
    mutationFn: (input: StartRunInput) => api.post<TrainingRun>(`${corpusApi(orgId, corpusId)}/runs`, input),
    onSettled: () => qc.invalidateQueries({ queryKey: runsKey(orgId, corpusId) }),
  });
}
