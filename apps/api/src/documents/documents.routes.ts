import { documentListQuerySchema, setSplitInputSchema } from "@tagloom/contracts";
import { Router } from "express";
import { actorOf, allow, memberOf, viewCorpusData } from "@/orgs/org-access";
import { deleteDocumentForGood, getDocumentDetail, getDocumentsPage, setDocumentSplit } from "./documents.service";
import { idParams, noBody, noQuery, validate, validated } from "@/security/route-meta";

export const documentsRouter = Router({ mergeParams: true });

documentsRouter.get("/corpora/:corpusId/documents", viewCorpusData, validate({ params: idParams("corpusId"), query: documentListQuerySchema }), async (req, res) => {
  const query = validated(req, "query", documentListQuerySchema);
  res.json(await getDocumentsPage(memberOf(req).organizationId, String(req.params.corpusId), query));
});

documentsRouter.post("/corpora/:corpusId/documents/split", allow("manager"), validate({ params: idParams("corpusId"), query: noQuery, body: setSplitInputSchema }), async (req, res) => {
  const input = validated(req, "body", setSplitInputSchema);
  res.json(await setDocumentSplit(memberOf(req).organizationId, String(req.params.corpusId), input, actorOf(req)));
});

documentsRouter.get("/corpora/:corpusId/documents/:documentId", viewCorpusData, validate({ params: idParams("corpusId", "documentId"), query: noQuery }), async (req, res) => {
  res.json(await getDocumentDetail(memberOf(req).organizationId, String(req.params.corpusId), String(req.params.documentId)));
});

documentsRouter.delete("/corpora/:corpusId/documents/:documentId", allow("manager"), validate({ params: idParams("corpusId", "documentId"), query: noQuery, body: noBody }), async (req, res) => {
  await deleteDocumentForGood(memberOf(req).organizationId, String(req.params.corpusId), String(req.params.documentId), actorOf(req));
  res.status(204).end();
});
