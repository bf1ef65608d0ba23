import type { Tagger } from "@tagloom/contracts";
import { useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { corpusApi, taggersKey } from "./keys";

/** The corpus's taggers, newest first. */
export function useTaggers(orgId: string, corpusId: string) {
  return useQuery({
    queryKey: [...taggersKey(orgId, corpusId), "list"],
    queryFn: () => api.get<{ items: Tagger[]; nextCursor: string | null }>(`${corpusApi(orgId, corpusId)}/taggers?limit=100`),
  });
}
