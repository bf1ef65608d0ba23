import { listEntityTypes } from "@/corpora/corpora.service";
import { findAssignmentFacts } from "./assignments.repository";
import { type TypeIndex, indexTypes } from "./span-mapping";

// Autosave is the hottest route: every annotator saves about once a second. What a save is checked
// against is kept here so that a save costs one conditional UPDATE:
// - an assignment's organization, corpus, document and annotator never change after it is made;
// - a corpus's entity types change rarely, and for at most TYPES_MAX_AGE_MS after a change a save
//   may still be checked against the previous schema. That is no worse than a save that read the
//   schema just before the change: spans of a deleted type are dropped when read, and deleting a
//   type bumps the versions of the assignments that had it, so their next save reloads.

export type AssignmentFacts = { organizationId: string; corpusId: string; documentId: string; annotatorId: string };

const MAX_FACTS = 200_000;
const facts = new Map<string, AssignmentFacts>();

/** The fixed facts of an organization's assignment, or null when it does not exist. */
export async function getAssignmentFacts(organizationId: string, assignmentId: string): Promise<AssignmentFacts | null> {
  const key = `${organizationId}/${assignmentId}`;
  const hit = facts.get(key);
  if (hit) return hit;
  const found = await findAssignmentFacts(organizationId, assignmentId);
  if (!found) return null;
  if (facts.size >= MAX_FACTS) facts.delete(facts.keys().next().value!);
  facts.set(key, found);
  return found;
}

const TYPES_MAX_AGE_MS = 2000;
const types = new Map<string, { at: number; index: Promise<TypeIndex> }>();

/**
 * The corpus's entity types, read at most TYPES_MAX_AGE_MS ago, or now when `fresh` (NotFoundError
 * for a missing corpus).
 */
export function getRecentTypeIndex(organizationId: string, corpusId: string, { fresh = false, now = Date.now() } = {}): Promise<TypeIndex> {
  const key = `${organizationId}/${corpusId}`;
  const hit = types.get(key);
  if (hit && !fresh && now - hit.at < TYPES_MAX_AGE_MS) return hit.index;
  const index = listEntityTypes(organizationId, corpusId).then(indexTypes);
  types.set(key, { at: now, index });
  index.catch(() => types.delete(key));
  if (types.size > 10_000) {
    for (const [k, v] of types) if (now - v.at >= TYPES_MAX_AGE_MS) types.delete(k);
  }
  return index;
}
