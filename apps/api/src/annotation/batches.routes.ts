import { createBatchInputSchema } from "@tagloom/contracts";
import { Router } from "express";
import { z } from "zod";
import { actorOf, allow, memberOf } from "@/orgs/org-access";
import { createBatch, getBatchDetail, getBatchesPage } from "./batches.service";
import { getBatchAgreement } from "./review.service";
import { idParams, noQuery, validate, validated } from "@/security/route-meta";

const batchListQuerySchema = z.object({
  corpusId: z.uuid("Not a corpus id.").optional(),
  cursor: z.string().max(500).optional(),
  limit: z.coerce.number().int().min(1).max(200).default(50),
});

/** Batches (managers and admins), below /orgs/:orgId. */
export const batchesRouter = Router({ mergeParams: true });

batchesRouter.get("/batches", allow("manager"), validate({ query: batchListQuerySchema }), async (req, res) => {
  const query = validated(req, "query", batchListQuerySchema);
  res.json(await getBatchesPage(memberOf(req).organizationId, query));
});

const corpusBatchListQuery = batchListQuerySchema.omit({ corpusId: true });
batchesRouter.get("/corpora/:corpusId/batches", allow("manager"), validate({ params: idParams("corpusId"), query: corpusBatchListQuery }), async (req, res) => {
  const query = validated(req, "query", corpusBatchListQuery);
  res.json(await getBatchesPage(memberOf(req).organizationId, { ...query, corpusId: String(req.params.corpusId) }));
});

batchesRouter.post("/corpora/:corpusId/batches", allow("manager"), validate({ params: idParams("corpusId"), query: noQuery, body: createBatchInputSchema }), async (req, res) => {
  const input = validated(req, "body", createBatchInputSchema);
  res.status(201).json(await createBatch(memberOf(req).organizationId, String(req.params.corpusId), input, actorOf(req)));
});

batchesRouter.get("/corpora/:corpusId/batches/:batchId", allow("manager"), validate({ params: idParams("corpusId", "batchId"), query: noQuery }), async (req, res) => {
  res.json(await getBatchDetail(memberOf(req).organizationId, String(req.params.corpusId), String(req.params.batchId)));
});

batchesRouter.get("/corpora/:corpusId/batches/:batchId/agreement", allow("manager"), validate({ params: idParams("corpusId", "batchId"), query: noQuery }), async (req, res) => {
  res.json(await getBatchAgreement(memberOf(req).organizationId, String(req.params.corpusId), String(req.params.batchId)));
});
