import { corpusListQuerySchema, createCorpusInputSchema, deleteCorpusInputSchema, updateCorpusInputSchema } from "@tagloom/contracts";
import { Router } from "express";
import { actorOf, allow, anyMember, memberOf } from "@/orgs/org-access";
import { changeCorpus, createCorpus, deleteCorpusForGood, getCorporaPage, getCorpusDetail } from "./corpora.service";
import { bodyOrEmpty, idParams, noQuery, validate, validated } from "@/security/route-meta";

export const corporaRouter = Router({ mergeParams: true });

corporaRouter.get("/corpora", anyMember, validate({ query: corpusListQuerySchema }), async (req, res) => {
  const query = validated(req, "query", corpusListQuerySchema);
  res.json(await getCorporaPage(memberOf(req).organizationId, query));
});

corporaRouter.post("/corpora", allow("manager"), validate({ query: noQuery, body: createCorpusInputSchema }), async (req, res) => {
  const input = validated(req, "body", createCorpusInputSchema);
  res.status(201).json(await createCorpus(memberOf(req).organizationId, input, actorOf(req)));
});

corporaRouter.get("/corpora/:corpusId", anyMember, validate({ params: idParams("corpusId"), query: noQuery }), async (req, res) => {
  res.json(await getCorpusDetail(memberOf(req).organizationId, String(req.params.corpusId)));
});

corporaRouter.patch("/corpora/:corpusId", allow("manager"), validate({ params: idParams("corpusId"), query: noQuery, body: updateCorpusInputSchema }), async (req, res) => {
  const input = validated(req, "body", updateCorpusInputSchema);
  res.json(await changeCorpus(memberOf(req).organizationId, String(req.params.corpusId), input, actorOf(req)));
});

const deleteCorpusBody = bodyOrEmpty(deleteCorpusInputSchema);
corporaRouter.delete("/corpora/:corpusId", allow("manager"), validate({ params: idParams("corpusId"), query: noQuery, body: deleteCorpusBody }), async (req, res) => {
  const { confirmName } = validated(req, "body", deleteCorpusBody);
  await deleteCorpusForGood(memberOf(req).organizationId, String(req.params.corpusId), confirmName, actorOf(req));
  res.status(204).end();
});
