import { type BatchAgreement, type ReviewDocumentView, type ReviewListItem, type Span, checkSpans } from "@tagloom/contracts";
import type { Actor } from "@/audit/audit.service";
import { recordAudit } from "@/audit/audit.service";
import { getCorpus, listEntityTypes } from "@/corpora/corpora.service";
import { db } from "@/db/knex";
import { isUuid, iso } from "@/db/types";
import { ConflictError, NotFoundError, ValidationError } from "@/errors";
import { getDocumentForAnnotation, getDocumentSummaries, getGoldSpans, saveGoldSpans, setAnnotationStatus } from "@/documents/documents.service";
import { dispatchEmails, queueEmail } from "@/mail/mail.service";
import { getMembersByIds } from "@/members/members.service";
import { computeAgreement } from "./agreement";
import { assignmentReturnedEmail } from "./annotation.emails";
import { type AssignmentRow, findAssignment, listAssignmentsOfBatchDocument, listFinishedAssignmentsOfBatch, listReviewHeads, markReviewed } from "./assignments.repository";
import { findBatch, findBatchesByIds } from "./batches.repository";
import { requireBatch } from "./batches.service";
import { indexTypes, namedSpans, plainSpans } from "./span-mapping";

type Reviewer = Actor & { userId: string; name: string };

async function memberNames(organizationId: string, userIds: string[]): Promise<Map<string, string>> {
  const members = await getMembersByIds(organizationId, [...new Set(userIds)]);
  return new Map(members.map((m) => [m.userId, m.name]));
}

/** Documents with submitted work waiting for review, with all their assignments in that batch. */
export async function listReview(organizationId: string, filter: { corpusId?: string | undefined; batchId?: string | undefined }): Promise<ReviewListItem[]> {
  if (filter.corpusId) await getCorpus(organizationId, filter.corpusId);
  if (filter.batchId && !(await findBatch(organizationId, filter.batchId, filter.corpusId))) throw new NotFoundError("batch");
  const heads = await listReviewHeads(organizationId, filter);
  const [batches, docs, names] = await Promise.all([
    findBatchesByIds(organizationId, [...new Set(heads.map((h) => h.batchId))]),
    getDocumentSummaries(organizationId, [...new Set(heads.map((h) => h.documentId))]),
    memberNames(organizationId, heads.map((h) => h.annotatorId)),
  ]);
  const batchName = new Map(batches.map((b) => [b.id, b.name]));
  const title = new Map(docs.map((d) => [d.id, d.title]));
  const items = new Map<string, ReviewListItem>();
  for (const h of heads) {
    const key = `${h.batchId}/${h.documentId}`;
    const item = items.get(key) ?? {
      batchId: h.batchId,
      batchName: batchName.get(h.batchId) ?? "",
      corpusId: h.corpusId,
      documentId: h.documentId,
      documentTitle: title.get(h.documentId) ?? "",
      assignments: [],
      ready: true,
    };
    item.assignments.push({ id: h.id, annotatorId: h.annotatorId, annotatorName: names.get(h.annotatorId) ?? "Former member", state: h.state, submittedAt: iso(h.submittedAt) });
    if (h.state !== "submitted" && h.state !== "accepted") item.ready = false;
    items.set(key, item);
  }
  return [...items.values()];
}

async function loadReviewAssignments(organizationId: string, corpusId: string, batchId: string, documentId: string) {
  if (!isUuid(documentId)) throw new NotFoundError("document");
  const batch = await requireBatch(organizationId, corpusId, batchId);
  const rows = await listAssignmentsOfBatchDocument(organizationId, batch.id, documentId);
  if (!rows.length) throw new NotFoundError("document");
  return { batch, rows };
}

/** The review page of one document of a batch: the text, every annotator's spans and the gold so far. */
export async function getReviewDocument(organizationId: string, corpusId: string, batchId: string, documentId: string): Promise<ReviewDocumentView> {
  const { batch, rows } = await loadReviewAssignments(organizationId, corpusId, batchId, documentId);
  const [doc, types, gold, summaries, names] = await Promise.all([
    getDocumentForAnnotation(organizationId, documentId),
    listEntityTypes(organizationId, corpusId),
    getGoldSpans(organizationId, documentId),
    getDocumentSummaries(organizationId, [documentId]),
    memberNames(organizationId, rows.map((r) => r.annotatorId)),
  ]);
  const index = indexTypes(types);
  return {
    batch: { id: batch.id, name: batch.name, dueDate: batch.dueDate },
    corpusId,
    document: { id: doc.id, title: doc.title, text: doc.text, tokens: doc.tokens },
    entityTypes: types,
    assignments: rows
      .map((r) => ({
      id: r.id,
      annotator: { userId: r.annotatorId, name: names.get(r.annotatorId) ?? "Former member" },
      state: r.state,
      // Work in progress stays private until it is submitted.
      spans: r.state === "submitted" || r.state === "accepted" ? namedSpans(r.spans, index) : [],
      submittedAt: iso(r.submittedAt),
      reviewComment: r.reviewComment,
      }))
      .sort((a, b) => a.annotator.name.localeCompare(b.annotator.name) || a.id.localeCompare(b.id)),
    gold: summaries[0]?.annotationStatus === "gold" ? gold : null,
    ready: rows.every((r) => r.state === "submitted"),
  };
}

async function requireSubmitted(organizationId: string, corpusId: string, assignmentId: string): Promise<AssignmentRow> {
  if (!isUuid(assignmentId) || !isUuid(corpusId)) throw new NotFoundError("assignment");
  const row = await findAssignment(organizationId, assignmentId);
  if (!row || row.corpusId !== corpusId) throw new NotFoundError("assignment");
  if (row.state !== "submitted") {
    throw new ConflictError(`Only submitted work can be reviewed; this assignment is ${row.state.replace("_", " ")}.`, { state: row.state }, "not_submitted");
  }
  return row;
}

/**
 * Makes the settled spans of a document of a batch its gold and accepts every assignment of it
 * there. Every assignment must be submitted (none still open, in progress or sent back).
 */
export async function settleDocument(organizationId: string, corpusId: string, batchId: string, documentId: string, spans: Span[], actor: Reviewer): Promise<void> {
  await loadReviewAssignments(organizationId, corpusId, batchId, documentId);
  const [types, doc] = await Promise.all([listEntityTypes(organizationId, corpusId), getDocumentForAnnotation(organizationId, documentId)]);
  const problem = checkSpans(spans, doc.tokens, doc.text.length, indexTypes(types).names);
  if (problem) throw new ValidationError(problem.message, { fields: { [`spans.${problem.index}`]: [problem.message] }, spanIndex: problem.index });
  await db.transaction(async (trx) => {
    const rows = await listAssignmentsOfBatchDocument(organizationId, batchId, documentId, trx, true);
    const waiting = rows.filter((r) => r.state !== "submitted");
    if (waiting.length) {
      const accepted = waiting.every((r) => r.state === "accepted");
      throw new ConflictError(
        accepted
          ? "This document has already been settled in this batch."
          : `Wait until every annotator has submitted: ${rows.length - waiting.length} of ${rows.length} have.`,
        { states: rows.map((r) => r.state) },
        accepted ? "already_settled" : "not_ready",
      );
    }
    await saveGoldSpans(organizationId, documentId, spans, "review", actor.userId, trx);
    await markReviewed(organizationId, rows.map((r) => r.id), { state: "accepted", comment: null, reviewerId: actor.userId }, trx);
    await recordAudit(trx, actor, organizationId, "document.settled", { type: "document", id: documentId, label: doc.title }, {
      batchId,
      assignments: rows.length,
      spans: spans.length,
    });
  });
}

/** Accepts the one submitted assignment of a document in its batch: its spans become the gold. */
export async function acceptAssignment(organizationId: string, corpusId: string, assignmentId: string, actor: Reviewer): Promise<void> {
  const row = await requireSubmitted(organizationId, corpusId, assignmentId);
  const siblings = await listAssignmentsOfBatchDocument(organizationId, row.batchId, row.documentId);
  if (siblings.length > 1) {
    throw new ConflictError(
      `${siblings.length} annotators have this document in the batch: compare their work and settle it instead.`,
      { annotators: siblings.length },
      "needs_settling",
    );
  }
  const index = indexTypes(await listEntityTypes(organizationId, corpusId));
  await settleDocument(organizationId, corpusId, row.batchId, row.documentId, plainSpans(row.spans, index), actor);
}

/** Sends submitted work back to its annotator with a comment; they get an e-mail and can edit again. */
export async function returnAssignment(organizationId: string, corpusId: string, assignmentId: string, comment: string, actor: Reviewer): Promise<void> {
  const row = await requireSubmitted(organizationId, corpusId, assignmentId);
  const [[doc], batch, annotator] = await Promise.all([
    getDocumentSummaries(organizationId, [row.documentId]),
    findBatch(organizationId, row.batchId),
    getMembersByIds(organizationId, [row.annotatorId]).then((m) => m[0]),
  ]);
  const emailId = await db.transaction(async (trx) => {
    const locked = await findAssignment(organizationId, row.id, trx, true);
    if (!locked || locked.state !== "submitted") throw new ConflictError("This assignment was reviewed meanwhile.", { state: locked?.state ?? null }, "not_submitted");
    await markReviewed(organizationId, [row.id], { state: "returned", comment, reviewerId: actor.userId }, trx);
    if (doc && doc.annotationStatus !== "gold") await setAnnotationStatus(organizationId, [row.documentId], "in_progress", trx);
    await recordAudit(trx, actor, organizationId, "assignment.returned", { type: "assignment", id: row.id, label: doc?.title ?? null }, {
      documentId: row.documentId,
      annotatorId: row.annotatorId,
    });
    if (!annotator) return null;
    return queueEmail(trx, {
      to: annotator.email,
      organizationId,
      kind: "assignment_returned",
      content: assignmentReturnedEmail({
        organizationId,
        corpusId,
        assignmentId: row.id,
        documentTitle: doc?.title ?? "a document",
        batchName: batch?.name ?? "",
        comment,
        reviewer: actor.name,
      }),
    });
  });
  if (emailId) await dispatchEmails([emailId]);
}

/** Entity-level F1 and Cohen's kappa of every pair of annotators of a batch, and pooled. */
export async function getBatchAgreement(organizationId: string, corpusId: string, batchId: string): Promise<BatchAgreement> {
  const batch = await requireBatch(organizationId, corpusId, batchId);
  const rows = await listFinishedAssignmentsOfBatch(organizationId, batch.id);
  const byDocument = new Map<string, AssignmentRow[]>();
  for (const r of rows) byDocument.set(r.documentId, [...(byDocument.get(r.documentId) ?? []), r]);
  const shared = [...byDocument.entries()].filter(([, rs]) => rs.length >= 2);
  const documents = [];
  for (const [documentId, rs] of shared) {
    const doc = await getDocumentForAnnotation(organizationId, documentId);
    const tokens = doc.tokens.starts.map((start, i) => ({ start, end: doc.tokens.ends[i]! }));
    documents.push({
      tokens,
      // Type ids stand in for names: agreement only asks whether two types are the same.
      byAnnotator: new Map(rs.map((r) => [r.annotatorId, r.spans.map((s) => ({ start: s.start, end: s.end, type: s.typeId }))])),
    });
  }
  const figures = computeAgreement(documents);
  const names = await memberNames(organizationId, rows.map((r) => r.annotatorId));
  const who = (userId: string) => ({ userId, name: names.get(userId) ?? "Former member" });
  return {
    batchId: batch.id,
    // Each pair reads in name order ("Ines & Jory"), its one-sided counts swapped to match.
    pairs: figures.pairs
      .map((p) => {
        const [a, b] = [who(p.annotatorA), who(p.annotatorB)];
        return a.name.localeCompare(b.name) <= 0
          ? { ...p, annotatorA: a, annotatorB: b }
          : { ...p, annotatorA: b, annotatorB: a, onlyA: p.onlyB, onlyB: p.onlyA };
      })
      .sort((x, y) => x.annotatorA.name.localeCompare(y.annotatorA.name) || x.annotatorB.name.localeCompare(y.annotatorB.name)),
    overall: figures.overall,
  };
}
