import { corpusListQuerySchema, createCorpusInputSchema, deleteCorpusInputSchema, updateCorpusInputSchema } from "@tagloom/contracts";
import { Router } from "express";
import { parseOrThrow } from "@/errors";
import { actorOf, allow, anyMember, memberOf } from "@/orgs/org-access";
import { changeCorpus, createCorpus, deleteCorpusForGood, getCorporaPage, getCorpusDetail } from "./corpora.service";
import { bodyOrEmpty, idParams, noQuery, validate } from "@/security/route-meta";

export const corporaRouter = Router({ mergeParams: true });

corporaRouter.get("/corpora", anyMember, validate({ query: corpusListQuerySchema }), async (req, res) => {
  const query = parseOrThrow(corpusListQuerySchema, req.query, "query");
  res.json(await getCorporaPage(memberOf(req).organizationId, query));
});

corporaRouter.post("/corpora", allow("manager"), validate({ query: noQuery, body: createCorpusInputSchema }), async (req, res) => {
  const input = parseOrThrow(createCorpusInputSchema, req.body);
  res.status(201).json(await createCorpus(memberOf(req).organizationId, input, actorOf(req)));
});

corporaRouter.get("/corpora/:corpusId", anyMember, validate({ params: idParams("corpusId"), query: noQuery }), async (req, res) => {
  res.json(await getCorpusDetail(memberOf(req).organizationId, String(req.params.corpusId)));
});

corporaRouter.patch("/corpora/:corpusId", allow("manager"), validate({ params: idParams("corpusId"), query: noQuery, body: updateCorpusInputSchema }), async (req, res) => {
  const input = parseOrThrow(updateCorpusInputSchema, req.body);
  res.json(await changeCorpus(memberOf(req).organizationId, String(req.params.corpusId), input, actorOf(req)));
});

corporaRouter.delete("/corpora/:corpusId", allow("manager"), validate({ params: idParams("corpusId"), query: noQuery, body: bodyOrEmpty(deleteCorpusInputSchema) }), async (req, res) => {
  const { confirmName } = parseOrThrow(deleteCorpusInputSchema, req.body ?? {});
  await deleteCorpusForGood(memberOf(req).organizationId, String(req.params.corpusId), confirmName, actorOf(req));
  res.status(204).end();
});
