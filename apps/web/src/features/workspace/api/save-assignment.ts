import type { SaveAssignmentInput, SaveAssignmentResult } from "@tagloom/contracts";
import { api } from "@/lib/api-client";

/**
 * Autosave: replaces the spans if `version` is still current (409 with the server's copy otherwise).
 * Network and server faults are shown by the save status line ("Not saved yet; trying again"), not toasted.
 */
export const saveAssignment = (orgId: string, corpusId: string, assignmentId: string, body: SaveAssignmentInput) =>
  api.put<SaveAssignmentResult>(`/orgs/${orgId}/corpora/${corpusId}/assignments/${assignmentId}`, body, { shownByCaller: true });
