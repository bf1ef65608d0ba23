import type { CreateBatchParsed } from "@tagloom/contracts";

export type PlannedAssignment = { documentId: string; annotatorId: string };

/**
 * Who annotates which document. Round robin walks the annotator list in turn, k at a time, so
 * with n annotators document i goes to annotators (i·k + j) mod n for j < k: every annotator gets
 * the same number of documents (±1) and, for k ≥ 2, each pair overlaps on some documents.
 * By hand takes the caller's lists as they are.
 */
export function planAssignments(documentIds: readonly string[], assignment: CreateBatchParsed["assignment"]): PlannedAssignment[] {
  if (assignment.mode === "by_hand") {
    const byDocument = new Map(assignment.documents.map((d) => [d.documentId, d.annotatorIds]));
    return documentIds.flatMap((documentId) => (byDocument.get(documentId) ?? []).map((annotatorId) => ({ documentId, annotatorId })));
  }
  const { annotatorIds, annotatorsPerDocument: k } = assignment;
  const n = annotatorIds.length;
  if (k > n) throw new RangeError(`cannot give each document ${k} annotators out of ${n}`);
  return documentIds.flatMap((documentId, i) =>
    Array.from({ length: k }, (_, j) => ({ documentId, annotatorId: annotatorIds[(i * k + j) % n]! })),
  );
}
