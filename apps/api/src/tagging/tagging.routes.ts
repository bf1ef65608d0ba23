import { tagRequestSchema } from "@tagloom/contracts";
import { Router } from "express";
import { isUuid } from "@/db/types";
import { NotFoundError, UnauthorizedError } from "@/errors";
import { requireApiToken } from "./bearer-token.middleware";
import { type TaggingRateLimit, taggingRateLimit } from "./tagging-rate-limit";
import { tagTextsForToken } from "./tagging.service";
import { bodyOrEmpty, idParams, noQuery, validate, validated } from "@/security/route-meta";

/** The pipelines' API, mounted at /api/v1: bearer API tokens only, rate limited per token. */
export function taggingRouter(limit?: TaggingRateLimit): Router {
  const v1 = Router();
  v1.use(requireApiToken, taggingRateLimit(limit));
  const tagBody = bodyOrEmpty(tagRequestSchema);
  v1.post("/corpora/:corpusId/tag", validate({ params: idParams("corpusId"), query: noQuery, body: tagBody }), async (req, res) => {
    if (!req.apiToken) throw new UnauthorizedError();
    const corpusId = String(req.params.corpusId);
    if (!isUuid(corpusId)) throw new NotFoundError("corpus");
    const body = validated(req, "body", tagBody);
    res.json(await tagTextsForToken(req.apiToken.organizationId, corpusId, body));
  });
  return v1;
}
