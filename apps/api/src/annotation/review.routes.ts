import { returnAssignmentInputSchema, settleDocumentInputSchema } from "@tagloom/contracts";
import { Router } from "express";
import { z } from "zod";
import { actorOf, allow, memberOf } from "@/orgs/org-access";
import { acceptAssignment, getReviewDocument, listReview, returnAssignment, settleDocument } from "./review.service";
import { idParams, noBody, noQuery, validate, validated } from "@/security/route-meta";

const reviewQuerySchema = z.object({ corpusId: z.uuid("Not a corpus id.").optional(), batchId: z.uuid("Not a batch id.").optional() });

/** Review of submitted work (managers and admins), below /orgs/:orgId. */
export const reviewRouter = Router({ mergeParams: true });

reviewRouter.get("/review", allow("manager"), validate({ query: reviewQuerySchema }), async (req, res) => {
  const filter = validated(req, "query", reviewQuerySchema);
  res.json({ items: await listReview(memberOf(req).organizationId, filter), nextCursor: null });
});

reviewRouter.get("/corpora/:corpusId/batches/:batchId/documents/:documentId/review", allow("manager"), validate({ params: idParams("corpusId", "batchId", "documentId"), query: noQuery }), async (req, res) => {
  const { corpusId, batchId, documentId } = req.params as Record<string, string>;
  res.json(await getReviewDocument(memberOf(req).organizationId, corpusId!, batchId!, documentId!));
});

reviewRouter.post("/corpora/:corpusId/batches/:batchId/documents/:documentId/settle", allow("manager"), validate({ params: idParams("corpusId", "batchId", "documentId"), query: noQuery, body: settleDocumentInputSchema }), async (req, res) => {
  const { spans } = validated(req, "body", settleDocumentInputSchema);
  const { corpusId, batchId, documentId } = req.params as Record<string, string>;
  await settleDocument(memberOf(req).organizationId, corpusId!, batchId!, documentId!, spans, actorOf(req));
  res.status(204).end();
});

reviewRouter.post("/corpora/:corpusId/assignments/:assignmentId/accept", allow("manager"), validate({ params: idParams("corpusId", "assignmentId"), query: noQuery, body: noBody }), async (req, res) => {
  await acceptAssignment(memberOf(req).organizationId, String(req.params.corpusId), String(req.params.assignmentId), actorOf(req));
  res.status(204).end();
});

reviewRouter.post("/corpora/:corpusId/assignments/:assignmentId/return", allow("manager"), validate({ params: idParams("corpusId", "assignmentId"), query: noQuery, body: returnAssignmentInputSchema }), async (req, res) => {
  const { comment } = validated(req, "body", returnAssignmentInputSchema);
  await returnAssignment(memberOf(req).organizationId, String(req.params.corpusId), String(req.params.assignmentId), comment, actorOf(req));
  res.status(204).end();
});
