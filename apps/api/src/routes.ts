import { type RequestHandler, Router } from "express";
import { apiTokensRouter } from "@/api-tokens/api-tokens.routes";
import { assignmentsRouter } from "@/annotation/assignments.routes";
import { batchesRouter } from "@/annotation/batches.routes";
import { suggestionsRouter } from "@/suggestions/suggestions.routes";
import { taggingRouter } from "@/tagging/tagging.routes";
import { reviewRouter } from "@/annotation/review.routes";
import { auditRouter } from "@/audit/audit.routes";
import { authRouter } from "@/auth/auth.routes";
import { billingRouter } from "@/billing/billing.routes";
import { requireSession } from "@/auth/session.middleware";
import { corporaRouter } from "@/corpora/corpora.routes";
import { entityTypesRouter } from "@/corpora/entity-types.routes";
import { devRouter } from "@/dev/dev.routes";
import { documentsRouter } from "@/documents/documents.routes";
import { exportsRouter } from "@/exports/exports.routes";
import { healthRouter } from "@/health/health.routes";
import { invitationLinkRouter, invitationsRouter } from "@/invitations/invitations.routes";
import { membersRouter } from "@/members/members.routes";
import { orgScope } from "@/orgs/org-access";
import { orgRouter, orgsRouter } from "@/orgs/orgs.routes";
import type { TaggingRateLimit } from "@/tagging/tagging-rate-limit";
import { trainingRouter } from "@/training/training.routes";
import { uploadsRouter } from "@/uploads/uploads.routes";

/**
 * Every API route, relative to /api. Tenant routes go on `org`, which is mounted at
 * /orgs/:orgId behind the session and membership checks: add one line per feature router.
 */
export function buildApiRoutes(options: { authLimiter: RequestHandler; taggingRateLimit?: TaggingRateLimit | undefined }): Router {
  const api = Router();
  // Pipelines: bearer API tokens only (never the session cookie), exempt from the origin check.
  api.use("/v1", taggingRouter(options.taggingRateLimit));
  api.use(healthRouter);
  api.use(devRouter);
  api.use(authRouter(options.authLimiter));
  api.use(invitationLinkRouter);
  api.use(orgsRouter);

  const org = Router({ mergeParams: true });
  org.use(membersRouter);
  org.use(invitationsRouter);
  org.use(auditRouter);
  org.use(billingRouter);
  org.use(corporaRouter);
  org.use(entityTypesRouter);
  org.use(documentsRouter);
  org.use(uploadsRouter);
  org.use(exportsRouter);
  org.use(batchesRouter);
  org.use(assignmentsRouter);
  org.use(reviewRouter);
  org.use(apiTokensRouter);
  org.use(suggestionsRouter);
  org.use(trainingRouter);
  org.use(orgRouter);
  api.use("/orgs/:orgId", requireSession, orgScope, org);
  return api;
}
