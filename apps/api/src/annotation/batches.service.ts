import { decodePageCursor, encodePageCursor } from "@/corpora/page-cursor";
import {
  type AssignmentCounts,
  type AssignmentState,
  type BatchDetail,
  type BatchSummary,
  type CreateBatchParsed,
  type Page,
} from "@tagloom/contracts";
import { type Actor, recordAudit } from "@/audit/audit.service";
import { getCorpus, getWritableCorpus } from "@/corpora/corpora.service";
import { db } from "@/db/knex";
import { isUuid, iso } from "@/db/types";
import { NotFoundError, ValidationError } from "@/errors";
import { getDocumentSummaries, setAnnotationStatus } from "@/documents/documents.service";
import { dispatchEmails, queueEmail } from "@/mail/mail.service";
import { getMembersByIds } from "@/members/members.service";
import { batchAssignedEmail } from "./annotation.emails";
import { countAssignmentStates, countBatchDocuments, insertAssignments, listAssignmentHeadsOfBatch } from "./assignments.repository";
import { planAssignments } from "./batch-plan";
import { type BatchRow, findBatch, insertBatch, listBatches } from "./batches.repository";

export function emptyCounts(): AssignmentCounts {
  return { total: 0, open: 0, in_progress: 0, submitted: 0, accepted: 0, returned: 0 };
}

function addCount(c: AssignmentCounts, state: AssignmentState, n: number): void {
  c[state] += n;
  c.total += n;
}

/** The batch of the organization and corpus; NotFoundError otherwise. */
export async function requireBatch(organizationId: string, corpusId: string, batchId: string): Promise<BatchRow> {
  if (!isUuid(batchId)) throw new NotFoundError("batch");
  await getCorpus(organizationId, corpusId);
  const batch = await findBatch(organizationId, batchId, corpusId);
  if (!batch) throw new NotFoundError("batch");
  return batch;
}

async function summarize(organizationId: string, batches: BatchRow[]): Promise<BatchSummary[]> {
  const ids = batches.map((b) => b.id);
  const [counts, documents] = await Promise.all([countAssignmentStates(organizationId, ids), countBatchDocuments(organizationId, ids)]);
  const byBatch = new Map<string, AssignmentCounts>();
  for (const c of counts) {
    const target = byBatch.get(c.batchId) ?? emptyCounts();
    addCount(target, c.state, c.count);
    byBatch.set(c.batchId, target);
  }
  const creators = await getMembersByIds(organizationId, [...new Set(batches.map((b) => b.createdBy).filter((x): x is string => x !== null))]);
  const creatorName = new Map(creators.map((m) => [m.userId, m.name]));
  return batches.map((b) => ({
    id: b.id,
    corpusId: b.corpusId,
    name: b.name,
    dueDate: b.dueDate,
    annotatorsPerDocument: b.annotatorsPerDocument,
    documentCount: documents.get(b.id)?.documents ?? 0,
    documentsSettled: documents.get(b.id)?.settled ?? 0,
    createdAt: iso(b.createdAt)!,
    createdBy: b.createdBy ? (creatorName.get(b.createdBy) ?? "Former member") : null,
    assignments: byBatch.get(b.id) ?? emptyCounts(),
  }));
}

function decodeCursor(cursor: string | undefined): { createdAt: string; id: string } | undefined {
  const c = decodePageCursor(cursor, "timestamp");
  return c ? { createdAt: String(c.value), id: c.id } : undefined;
}

/** Batches of the organization, or of one corpus, newest first. */
export async function getBatchesPage(
  organizationId: string,
  query: { corpusId?: string | undefined; cursor?: string | undefined; limit: number },
): Promise<Page<BatchSummary>> {
  if (query.corpusId) await getCorpus(organizationId, query.corpusId);
  const rows = await listBatches(organizationId, { corpusId: query.corpusId, limit: query.limit + 1, before: decodeCursor(query.cursor) });
  const more = rows.length > query.limit;
  const pageRows = more ? rows.slice(0, query.limit) : rows;
  const last = pageRows[pageRows.length - 1];
  return {
    items: await summarize(organizationId, pageRows),
    nextCursor: more && last ? encodePageCursor(iso(last.createdAt)!, last.id) : null,
  };
}

/** The batch page: overall progress, progress per annotator, and every document with its assignments. */
export async function getBatchDetail(organizationId: string, corpusId: string, batchId: string): Promise<BatchDetail> {
  const batch = await requireBatch(organizationId, corpusId, batchId);
  const [summary] = await summarize(organizationId, [batch]);
  const heads = await listAssignmentHeadsOfBatch(organizationId, batch.id);
  const annotatorIds = [...new Set(heads.map((h) => h.annotatorId))];
  const [members, docs] = await Promise.all([
    getMembersByIds(organizationId, annotatorIds),
    getDocumentSummaries(organizationId, [...new Set(heads.map((h) => h.documentId))]),
  ]);
  const memberById = new Map(members.map((m) => [m.userId, m]));
  const nameOf = (id: string) => memberById.get(id)?.name ?? "Former member";
  const perAnnotator = new Map<string, AssignmentCounts>(annotatorIds.map((id) => [id, emptyCounts()]));
  for (const h of heads) addCount(perAnnotator.get(h.annotatorId)!, h.state, 1);
  const docById = new Map(docs.map((d) => [d.id, d]));
  const documents = new Map<string, BatchDetail["documents"][number]>();
  for (const h of heads) {
    const doc = docById.get(h.documentId);
    const row = documents.get(h.documentId) ?? { documentId: h.documentId, title: doc?.title ?? "(deleted document)", tokenCount: doc?.tokenCount ?? 0, assignments: [] };
    row.assignments.push({ id: h.id, annotatorId: h.annotatorId, annotatorName: nameOf(h.annotatorId), state: h.state });
    documents.set(h.documentId, row);
  }
  return {
    ...summary!,
    annotators: annotatorIds
      .map((id) => ({ userId: id, name: nameOf(id), email: memberById.get(id)?.email ?? "", assignments: perAnnotator.get(id)! }))
      .sort((a, b) => a.name.localeCompare(b.name)),
    documents: [...documents.values()],
  };
}

/**
 * Makes a batch: checks that every document is in the corpus and every annotator a member,
 * creates one assignment per document and annotator, marks new documents in progress, and sends
 * each assignee one e-mail for the whole batch.
 */
export async function createBatch(
  organizationId: string,
  corpusId: string,
  input: CreateBatchParsed,
  actor: Actor & { userId: string; name: string },
): Promise<BatchSummary> {
  const corpus = await getWritableCorpus(organizationId, corpusId);
  const docs = await getDocumentSummaries(organizationId, input.documentIds);
  const inCorpus = new Set(docs.filter((d) => d.corpusId === corpusId).map((d) => d.id));
  const strangers = input.documentIds.filter((id) => !inCorpus.has(id));
  if (strangers.length) {
    throw new ValidationError(`${strangers.length} of the picked documents are not in the corpus "${corpus.name}".`, {
      fields: { documentIds: [`Not in this corpus: ${strangers.slice(0, 5).join(", ")}${strangers.length > 5 ? ", …" : ""}`] },
    });
  }
  if (input.dueDate && input.dueDate < new Date().toISOString().slice(0, 10)) {
    throw new ValidationError("The due date has passed.", { fields: { dueDate: ["Pick today or a later day."] } });
  }
  const plan = planAssignments(input.documentIds, input.assignment);
  const annotatorIds = [...new Set(plan.map((p) => p.annotatorId))];
  const members = await getMembersByIds(organizationId, annotatorIds);
  const memberById = new Map(members.map((m) => [m.userId, m]));
  const outsiders = annotatorIds.filter((id) => !memberById.has(id));
  if (outsiders.length) {
    const field = input.assignment.mode === "round_robin" ? "assignment.annotatorIds" : "assignment.documents";
    throw new ValidationError("Some of the picked annotators are not members of this organization.", {
      fields: { [field]: [`Not a member: ${outsiders.join(", ")}`] },
    });
  }
  const perDocument = new Map<string, number>();
  for (const p of plan) perDocument.set(p.documentId, (perDocument.get(p.documentId) ?? 0) + 1);
  const k = input.assignment.mode === "round_robin" ? input.assignment.annotatorsPerDocument : Math.max(...perDocument.values());

  const { batch, emailIds } = await db.transaction(async (trx) => {
    const batch = await insertBatch(
      { organizationId, corpusId, name: input.name, dueDate: input.dueDate, annotatorsPerDocument: k, createdBy: actor.userId },
      trx,
    );
    await insertAssignments(plan.map((p) => ({ organizationId, corpusId, batchId: batch.id, documentId: p.documentId, annotatorId: p.annotatorId })), trx);
    // Documents with gold keep it (and their status) until a review replaces it.
    const reopened = docs.filter((d) => d.annotationStatus !== "gold" && d.annotationStatus !== "in_progress").map((d) => d.id);
    await setAnnotationStatus(organizationId, reopened, "in_progress", trx);
    const emailIds: string[] = [];
    for (const annotatorId of annotatorIds) {
      const member = memberById.get(annotatorId)!;
      emailIds.push(
        await queueEmail(trx, {
          to: member.email,
          organizationId,
          kind: "batch_assigned",
          content: batchAssignedEmail({
            organizationId,
            batchName: batch.name,
            corpusName: corpus.name,
            documents: plan.filter((p) => p.annotatorId === annotatorId).length,
            dueDate: batch.dueDate,
            assignedBy: actor.name,
          }),
        }),
      );
    }
    await recordAudit(trx, actor, organizationId, "batch.created", { type: "batch", id: batch.id, label: batch.name }, {
      corpusId,
      documents: input.documentIds.length,
      annotators: annotatorIds.length,
      annotatorsPerDocument: k,
      mode: input.assignment.mode,
    });
    return { batch, emailIds };
  });
  await dispatchEmails(emailIds);
  const [summary] = await summarize(organizationId, [batch]);
  return summary!;
}
