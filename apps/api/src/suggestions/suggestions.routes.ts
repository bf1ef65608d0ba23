import { setSuggesterInputSchema, uncertainQuerySchema } from "@tagloom/contracts";
import { Router } from "express";
import { actorOf, allow, anyMember, memberOf } from "@/orgs/org-access";
import { getSuggesterStatus, getUncertainRanking, setSuggester } from "./suggestions.service";
import { idParams, noQuery, validate, validated } from "@/security/route-meta";

/** The corpus's suggester and the most-uncertain ranking, below /orgs/:orgId. */
export const suggestionsRouter = Router({ mergeParams: true });

suggestionsRouter.get("/corpora/:corpusId/suggester", anyMember, validate({ params: idParams("corpusId"), query: noQuery }), async (req, res) => {
  res.json(await getSuggesterStatus(memberOf(req).organizationId, String(req.params.corpusId)));
});

suggestionsRouter.put("/corpora/:corpusId/suggester", allow("data_lead"), validate({ params: idParams("corpusId"), query: noQuery, body: setSuggesterInputSchema }), async (req, res) => {
  const input = validated(req, "body", setSuggesterInputSchema);
  res.json(await setSuggester(memberOf(req).organizationId, String(req.params.corpusId), input, actorOf(req)));
});

suggestionsRouter.get("/corpora/:corpusId/uncertain", allow("manager", "data_lead"), validate({ params: idParams("corpusId"), query: uncertainQuerySchema }), async (req, res) => {
  const query = validated(req, "query", uncertainQuerySchema);
  res.json(await getUncertainRanking(memberOf(req).organizationId, String(req.params.corpusId), query));
});
