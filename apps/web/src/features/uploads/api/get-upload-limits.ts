import type { UploadLimits } from "@tagloom/contracts";
import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { corpusKey } from "./keys";

export const getUploadLimits = (orgId: string, corpusId: string) => api.get<UploadLimits>(`/orgs/${orgId}/corpora/${corpusId}/uploads/limits`);

export const uploadLimitsQueryOptions = (orgId: string, corpusId: string) =>
  queryOptions({ queryKey: [...corpusKey(orgId, corpusId), "upload-limits"], queryFn: () => getUploadLimits(orgId, corpusId), staleTime: 10 * 60_000 });

export function useUploadLimits(orgId: string, corpusId: string) {
  return useQuery(uploadLimitsQueryOptions(orgId, corpusId));
}
