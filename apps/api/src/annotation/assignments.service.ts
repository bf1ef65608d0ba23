import {
  type AnnotatedSpan,
  type AssignmentView,
  type Queue,
  type QueueItem,
  type Role,
  type SaveAssignmentResult,
  type Span,
  type StaleVersionDetails,
  checkSpans,
  editableAssignmentStates,
} from "@tagloom/contracts";
import { type Actor, recordAudit } from "@/audit/audit.service";
import { getCorpus, listEntityTypes } from "@/corpora/corpora.service";
import { db } from "@/db/knex";
import { type Db, isUuid, iso } from "@/db/types";
import { ConflictError, ForbiddenError, NotFoundError, ValidationError } from "@/errors";
import { getDocumentForAnnotation, getDocumentSummaries, getSuggestions, setAnnotationStatus } from "@/documents/documents.service";
import { getMembership } from "@/members/members.service";
import { recordSuggestionDecisions } from "@/suggestions/suggestions.service";
import {
  type AssignmentRow,
  allAssignmentsOfDocumentFinished,
  findAssignment,
  listDoneHeads,
  listQueueHeads,
  markSubmitted,
  saveAssignmentSpans,
} from "./assignments.repository";
import { findBatch, findBatchesByIds } from "./batches.repository";
import { getTokenBounds, primeTokenBounds } from "./document-cache";
import { getAssignmentFacts, getRecentTypeIndex } from "./save-caches";
import { type TypeIndex, indexTypes, namedSpans, pendingSuggestions, plainSpans, sameStoredSpans, storedSpans } from "./span-mapping";

/** The signed-in member as the annotation services need it. */
export type MemberContext = { organizationId: string; userId: string; role: Role };

/** Managers and admins see every assignment of the organization; others only their own. */
export function seesAllAssignments(role: Role): boolean {
  return role === "admin" || role === "manager";
}

/**
 * The assignment if the member may see it: a missing one, one of another corpus, and (for an
 * annotator) someone else's all answer 404 alike.
 */
export async function requireVisibleAssignment(member: MemberContext, corpusId: string, assignmentId: string, trx?: Db): Promise<AssignmentRow> {
  if (!isUuid(assignmentId) || !isUuid(corpusId)) throw new NotFoundError("assignment");
  const row = await findAssignment(member.organizationId, assignmentId, trx);
  if (!row || row.corpusId !== corpusId) throw new NotFoundError("assignment");
  if (row.annotatorId !== member.userId && !seesAllAssignments(member.role)) throw new NotFoundError("assignment");
  return row;
}

export function isEditable(row: { state: AssignmentRow["state"] }): boolean {
  return editableAssignmentStates.includes(row.state);
}

export function staleDetails(row: AssignmentRow, types: TypeIndex): StaleVersionDetails {
  return { version: row.version, state: row.state, spans: namedSpans(row.spans, types), dismissedSuggestions: plainSpans(row.dismissedSuggestions, types) };
}

/** Everything the workspace shows for one assignment. */
export async function getAssignmentView(member: MemberContext, corpusId: string, assignmentId: string): Promise<AssignmentView> {
  const row = await requireVisibleAssignment(member, corpusId, assignmentId);
  const [doc, types, suggestions, batch, annotator] = await Promise.all([
    getDocumentForAnnotation(member.organizationId, row.documentId),
    listEntityTypes(member.organizationId, row.corpusId),
    getSuggestions(member.organizationId, row.documentId),
    findBatch(member.organizationId, row.batchId),
    getMembership(member.organizationId, row.annotatorId),
  ]);
  primeTokenBounds(member.organizationId, doc.id, { textLength: doc.text.length, starts: doc.tokens.starts, ends: doc.tokens.ends });
  const index = indexTypes(types);
  const spans = namedSpans(row.spans, index);
  const dismissed = plainSpans(row.dismissedSuggestions, index);
  return {
    id: row.id,
    corpusId: row.corpusId,
    batch: { id: row.batchId, name: batch?.name ?? "", dueDate: batch?.dueDate ?? null },
    annotator: { userId: row.annotatorId, name: annotator?.name ?? "Former member" },
    state: row.state,
    version: row.version,
    canEdit: row.annotatorId === member.userId && isEditable(row),
    reviewComment: row.reviewComment,
    updatedAt: iso(row.updatedAt)!,
    document: { id: doc.id, title: doc.title, text: doc.text, tokens: doc.tokens },
    entityTypes: types,
    spans,
    suggestions: pendingSuggestions(suggestions, spans, dismissed),
    dismissedSuggestions: dismissed,
  };
}

function spanFieldError(problem: { index: number; message: string }, field: string): ValidationError {
  return new ValidationError(problem.message, { fields: { [`${field}.${problem.index}`]: [problem.message] }, spanIndex: problem.index });
}

/**
 * Autosave: replaces the assignee's spans if `version` is still the current one. A stale version
 * answers 409 with what the server holds (the client reloads it and shows what conflicted); a
 * submitted or reviewed assignment answers 409 too. Of several saves naming the same version
 * exactly one wins (a conditional UPDATE).
 *
 * A save whose answer was lost after it was stored comes again naming the same version with the
 * same spans: when the stored version is the very next one and holds exactly what is sent, that
 * version is the answer (200, nothing bumped), so the client carries on as if the first answer
 * had arrived instead of reloading what it already has.
 */
export async function saveAssignment(
  member: MemberContext,
  corpusId: string,
  assignmentId: string,
  input: { version: number; spans: AnnotatedSpan[]; dismissedSuggestions: Span[] },
): Promise<SaveAssignmentResult> {
  if (!isUuid(assignmentId) || !isUuid(corpusId)) throw new NotFoundError("assignment");
  const row = await getAssignmentFacts(member.organizationId, assignmentId);
  if (!row || row.corpusId !== corpusId) throw new NotFoundError("assignment");
  if (row.annotatorId !== member.userId) {
    if (!seesAllAssignments(member.role)) throw new NotFoundError("assignment");
    throw new ForbiddenError("Only the annotator of this assignment can change its spans.");
  }
  const [firstIndex, bounds] = await Promise.all([getRecentTypeIndex(member.organizationId, row.corpusId), getTokenBounds(member.organizationId, row.documentId)]);
  let index = firstIndex;
  let problem = checkSpans(input.spans, bounds, bounds.textLength, index.names);
  if (problem) {
    // The schema may have changed a moment ago: check once more against the current one.
    index = await getRecentTypeIndex(member.organizationId, row.corpusId, { fresh: true });
    problem = checkSpans(input.spans, bounds, bounds.textLength, index.names);
  }
  if (problem) throw spanFieldError(problem, "spans");
  // Dismissed suggestions only need to name a real type inside the text; they may overlap.
  const badDismissed = input.dismissedSuggestions.findIndex((s) => s.end > bounds.textLength || !index.names.has(s.type));
  if (badDismissed >= 0) {
    throw spanFieldError({ index: badDismissed, message: `Dismissed suggestion ${badDismissed + 1} is outside the text or has an unknown type.` }, "dismissedSuggestions");
  }
  const spans = storedSpans(input.spans, index);
  const dismissed = storedSpans(input.dismissedSuggestions, index);
  const saved = await saveAssignmentSpans(member.organizationId, assignmentId, member.userId, input.version, spans, dismissed);
  if (saved) {
    // Accepted and dismissed tagger suggestions feed the suggester's precision as annotators judged it.
    await recordSuggestionDecisions(
      { organizationId: member.organizationId, corpusId: row.corpusId, documentId: row.documentId, assignmentId, userId: member.userId },
      { accepted: spans.filter((s) => s.origin === "suggested"), dismissed },
    );
    return { version: saved.version, state: saved.state, updatedAt: iso(saved.updatedAt)! };
  }
  const current = await findAssignment(member.organizationId, assignmentId);
  if (!current) throw new NotFoundError("assignment");
  if (!isEditable(current)) {
    throw new ConflictError("This assignment has been submitted and can no longer be changed.", staleDetails(current, index), "assignment_locked");
  }
  if (current.version === input.version + 1 && sameStoredSpans(current.spans, spans) && sameStoredSpans(current.dismissedSuggestions, dismissed)) {
    return { version: current.version, state: current.state, updatedAt: iso(current.updatedAt)! };
  }
  throw new ConflictError(
    `These spans changed since you loaded them: the saved version is ${current.version}, yours was ${input.version}.`,
    staleDetails(current, index),
    "stale_version",
  );
}

/** Hands the assignment in for review; `version` must be the last saved one. Read-only afterwards. */
export async function submitAssignment(
  member: MemberContext,
  corpusId: string,
  assignmentId: string,
  version: number,
  actor: Actor,
): Promise<SaveAssignmentResult> {
  const row = await requireVisibleAssignment(member, corpusId, assignmentId);
  if (row.annotatorId !== member.userId) throw new ForbiddenError("Only the annotator of this assignment can submit it.");
  return db.transaction(async (trx) => {
    const done = await markSubmitted(member.organizationId, row.id, member.userId, version, trx);
    if (!done) {
      const current = (await findAssignment(member.organizationId, row.id, trx))!;
      const index = indexTypes(await listEntityTypes(member.organizationId, row.corpusId, trx));
      if (!isEditable(current)) throw new ConflictError("This assignment has already been submitted.", staleDetails(current, index), "assignment_locked");
      throw new ConflictError(
        `Your latest changes are not saved yet: the saved version is ${current.version}, yours was ${version}. Save, then submit.`,
        staleDetails(current, index),
        "stale_version",
      );
    }
    if (await allAssignmentsOfDocumentFinished(member.organizationId, row.documentId, trx)) {
      const [doc] = await getDocumentSummaries(member.organizationId, [row.documentId], trx);
      if (doc && doc.annotationStatus !== "gold") await setAnnotationStatus(member.organizationId, [row.documentId], "submitted", trx);
    }
    await recordAudit(trx, actor, member.organizationId, "assignment.submitted", { type: "assignment", id: row.id }, { documentId: row.documentId, batchId: row.batchId });
    return { version: done.version, state: done.state, updatedAt: iso(done.updatedAt)! };
  });
}

const STATE_ORDER = { returned: 0, in_progress: 1, open: 2, submitted: 3, accepted: 4 } as const;

/**
 * The member's unfinished assignments across corpora: sent-back work first, then by due date
 * (none last), work already started before new work, oldest first.
 */
/** How many finished assignments the queue's "Done" list shows. */
const DONE_LIMIT = 50;

export async function getQueue(member: MemberContext): Promise<Queue> {
  const [heads, doneHeads] = await Promise.all([
    listQueueHeads(member.organizationId, member.userId),
    listDoneHeads(member.organizationId, member.userId, DONE_LIMIT),
  ]);
  const all = [...heads, ...doneHeads];
  const [batches, docs] = await Promise.all([
    findBatchesByIds(member.organizationId, [...new Set(all.map((h) => h.batchId))]),
    getDocumentSummaries(member.organizationId, [...new Set(all.map((h) => h.documentId))]),
  ]);
  const corpusIds = [...new Set(all.map((h) => h.corpusId))];
  const corpora = await Promise.all(corpusIds.map((id) => getCorpus(member.organizationId, id)));
  const corpusName = new Map(corpora.map((c) => [c.id, c.name]));
  const batchById = new Map(batches.map((b) => [b.id, b]));
  const docById = new Map(docs.map((d) => [d.id, d]));
  const toItem = (h: (typeof all)[number]): QueueItem => ({
    assignmentId: h.id,
    corpusId: h.corpusId,
    corpusName: corpusName.get(h.corpusId) ?? "",
    batchId: h.batchId,
    batchName: batchById.get(h.batchId)?.name ?? "",
    dueDate: batchById.get(h.batchId)?.dueDate ?? null,
    documentId: h.documentId,
    documentTitle: docById.get(h.documentId)?.title ?? "",
    tokenCount: docById.get(h.documentId)?.tokenCount ?? 0,
    state: h.state,
    reviewComment: h.reviewComment,
    updatedAt: iso(h.updatedAt)!,
  });
  const items = heads.map(toItem);
  const done = doneHeads.map(toItem);
  const created = new Map(heads.map((h) => [h.id, h.createdAt.getTime()]));
  items.sort((a, b) => {
    const returned = Number(b.state === "returned") - Number(a.state === "returned");
    if (returned) return returned;
    const due = (a.dueDate ?? "9999-12-31").localeCompare(b.dueDate ?? "9999-12-31");
    if (due) return due;
    return STATE_ORDER[a.state] - STATE_ORDER[b.state] || created.get(a.assignmentId)! - created.get(b.assignmentId)!;
  });
  return { items, next: items[0] ?? null, done };
}
