import { finishedRunStatuses, type TrainingRun } from "@tagloom/contracts";
import { useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { corpusApi, runsKey } from "./keys";

export const RUN_LIST_LIMIT = 50;

/** The corpus's latest runs, newest first; polls while one of them is still going. */
export function useRuns(orgId: string, corpusId: string) {
  return useQuery({
    queryKey: [...runsKey(orgId, corpusId), "list"],
    queryFn: () => api.get<{ items: TrainingRun[]; nextCursor: string | null }>(`${corpusApi(orgId, corpusId)}/runs?limit=${RUN_LIST_LIMIT}`),
    refetchInterval: (q) => (q.state.data?.items.some((r) => !finishedRunStatuses.includes(r.status)) ? 2000 : false),
  });
}
