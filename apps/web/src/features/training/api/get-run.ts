import { finishedRunStatuses, type TrainingRun } from "@tagloom/contracts";
import { useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { corpusApi, runsKey } from "./keys";

/** Polling interval while a run is queued or training (ms). */
export const RUN_POLL_MS = 1000;

/** One run; refetched every second until it reaches a state it never leaves. */
export function useRun(orgId: string, corpusId: string, runId: string) {
  return useQuery({
    queryKey: [...runsKey(orgId, corpusId), runId],
    queryFn: () => api.get<TrainingRun>(`${corpusApi(orgId, corpusId)}/runs/${runId}`),
    // A tagger stored without a run has no run id: asking for "runs/" would ask for the list.
    enabled: runId !== "",
    refetchInterval: (q) => (q.state.data && finishedRunStatuses.includes(q.state.data.status) ? false : RUN_POLL_MS),
  });
}
