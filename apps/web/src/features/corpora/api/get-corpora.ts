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
  });

export function useCorpora(orgId: string, archived: CorporaFilter = "false", { enabled = true }: { enabled?: boolean } = {}) {
  return useInfiniteQuery({ ...corporaQueryOptions(orgId, archived), enabled });
}
