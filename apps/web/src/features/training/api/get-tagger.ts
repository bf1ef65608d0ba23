import type { Tagger } from "@tagloom/contracts";
import { useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { corpusApi, taggersKey } from "./keys";

/** One tagger with its evaluation (taggers never change, so it is never refetched). */
export function useTagger(orgId: string, corpusId: string, taggerId: string) {
  return useQuery({
    queryKey: [...taggersKey(orgId, corpusId), taggerId],
    queryFn: () => api.get<Tagger>(`${corpusApi(orgId, corpusId)}/taggers/${taggerId}`),
    staleTime: Infinity,
  });
}

/** Where the browser downloads a tagger's JSON or its evaluation (same-origin link, session cookie). */
export const taggerDownloadUrl = (orgId: string, corpusId: string, taggerId: string, what: "download" | "evaluation") =>
  `/api${corpusApi(orgId, corpusId)}/taggers/${taggerId}/${what}`;
