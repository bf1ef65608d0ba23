import type { AssignmentView } from "@tagloom/contracts";
import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";

export const getAssignment = (orgId: string, corpusId: string, assignmentId: string) =>
  api.get<AssignmentView>(`/orgs/${orgId}/corpora/${corpusId}/assignments/${assignmentId}`);

export const assignmentQueryOptions = (orgId: string, corpusId: string, assignmentId: string) =>
  queryOptions({
    queryKey: ["orgs", orgId, "assignments", assignmentId],
    queryFn: () => getAssignment(orgId, corpusId, assignmentId),
    // The workspace holds the working copy; refetching under it would only reset it.
    staleTime: Infinity,
    gcTime: 0,
  });

export function useAssignment(orgId: string, corpusId: string, assignmentId: string) {
  return useQuery(assignmentQueryOptions(orgId, corpusId, assignmentId));
}
