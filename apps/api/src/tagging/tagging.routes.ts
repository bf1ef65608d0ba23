import { tagRequestSchema } from "@tagloom/contracts";
import { Router } from "express";
import { isUuid } from "@/db/types";
import { NotFoundError, UnauthorizedError, parseOrThrow } from "@/errors";
import { requireApiToken } from "./bearer-token.middleware";
import { type TaggingRateLimit, taggingRateLimit } from "./tagging-rate-limit";
import { tagTextsForToken } from "./tagging.service";
import { bodyOrEmpty, idParams, noQuery, validate } from "@/security/route-meta";

/** The pipelines' API, mounted at /api/v1: bearer API tokens only, rate limited per token. */
export function taggingRouter(limit?: TaggingRateLimit): Router {
  const v1 = Router();
  v1.use(requireApiToken, taggingRateLimit(limit));
  v1.post("/corpora/:corpusId/tag", validate({ params: idParams("corpusId"), query: noQuery, body: bodyOrEmpty(tagRequestSchema) }), async (req, res) => {
    if (!req.apiToken) throw new UnauthorizedError();
    const corpusId = String(req.params.corpusId);
    if (!isUuid(corpusId)) throw new NotFoundError("corpus");
    const body = parseOrThrow(tagRequestSchema, req.body ?? {});
    res.json(await tagTextsForToken(req.apiToken.organizationId, corpusId, body));
  });
  return v1;
}
