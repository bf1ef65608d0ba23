import type { Tagger } from "@tagloom/contracts";
import { useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { corpusApi, taggersKey } from "./keys";

/**
 * The corpus's taggers, newest first. Asked again on every visit (a run may have finished since)
 * and every few seconds while `watching` (a run of the corpus is still going).
 */
export function useTaggers(orgId: string, corpusId: string, watching = false) {
  return useQuery({
    queryKey: [...taggersKey(orgId, corpusId), "list"],
    queryFn: () => api.get<{ items: Tagger[]; nextCursor: string | null }>(`${corpusApi(orgId, corpusId)}/taggers?limit=100`),
    refetchOnMount: "always",
    refetchInterval: watching ? 2000 : false,
  });
}
