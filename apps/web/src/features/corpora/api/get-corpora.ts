import type { CorpusSummary, Page } from "@tagloom/contracts";
import { infiniteQueryOptions, useInfiniteQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { corporaKey } from "./keys";

export type CorporaFilter = "false" | "true" | "all";

export const getCorpora = (orgId: string, archived: CorporaFilter, cursor?: string) =>
  api.get<Page<CorpusSummary>>(`/orgs/${orgId}/corpora`, { query: { archived, cursor, limit: 50 } });

export const corporaQueryOptions = (orgId: string, archived: CorporaFilter) =>
  infiniteQueryOptions({
    queryKey: [...corporaKey(orgId), "list", archived],
    queryFn: ({ pageParam }) => getCorpora(orgId, archived, pageParam),
    initialPageParam: undefined as string | undefined,
    getNextPageParam: (last) => last.nextCursor ?? undefined,
    // Other members create corpora (a data lead opens Corpora right after the manager made one):
    // read the list afresh on each visit, as the queue does.
    staleTime: 0,
  });

export function useCorpora(orgId: string, archived: CorporaFilter = "false", { enabled = true }: { enabled?: boolean } = {}) {
  return useInfiniteQuery({ ...corporaQueryOptions(orgId, archived), enabled });
}
