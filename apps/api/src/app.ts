import { randomUUID } from "node:crypto";
import express, { type Express } from "express";
import helmet from "helmet";
import { pinoHttp } from "pino-http";
import { sessionMiddleware } from "@/auth/session.middleware";
import { billingWebhookRouter } from "@/billing/billing.routes";
import { env } from "@/config/env";
import { errorMiddleware, notFoundHandler } from "@/errors";
import { logger, serializeRequest } from "@/logger";
import { buildApiRoutes } from "@/routes";
import { originCheck } from "@/security/origin-check";
import { authRateLimit } from "@/security/rate-limits";
import { noStore, refuseInvalidUtf8, refuseUnstorableText } from "@/security/text-guard";
import { mountWebApp } from "@/web-static";

export type AppOptions = {
  /** Attempts per address per 15 minutes on sign-in, sign-up and reset (default: AUTH_RATE_LIMIT). */
  authRateLimit?: number;
  /** Express "trust proxy" (default: TRUST_PROXY); X-Forwarded-For is believed only from these peers. */
  trustProxy?: false | number | string;
  /** Tagging API requests per token per window (default: TAGGING_RATE_LIMIT per TAGGING_RATE_WINDOW_SECONDS). */
  taggingRateLimit?: { points: number; windowSeconds: number };
};

/** Builds the Express app (no listen): middleware, routes under /api, the web app, errors. */
export function createApp(options: AppOptions = {}): Express {
  const app = express();
  app.disable("x-powered-by");
  // Explicit (TRUST_PROXY): with the default nobody may choose the address rate limits key on.
  app.set("trust proxy", options.trustProxy ?? env.trustProxy);
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: { "upgrade-insecure-requests": null, "img-src": ["'self'", "data:", "blob:"] },
      },
      strictTransportSecurity: env.cookieSecure,
    }),
  );
  app.use(
    pinoHttp({
      logger,
      genReqId: (req, res) => {
        const incoming = req.headers["x-request-id"];
        const id = typeof incoming === "string" && /^[\w-]{1,64}$/.test(incoming) ? incoming : randomUUID();
        res.setHeader("X-Request-Id", id);
        return id;
      },
      autoLogging: { ignore: (req) => req.url === "/api/health" },
      serializers: { req: serializeRequest },
    }),
  );

  const api = express.Router();
  api.use(noStore);
  // Before the JSON parser: the webhook's signature is checked over the raw body.
  api.use(billingWebhookRouter);
  api.use(express.json({ limit: "2mb", verify: refuseInvalidUtf8 }));
  api.use(refuseUnstorableText);
  api.use(originCheck(["/api/v1/", "/api/billing/webhook"]));
  api.use(sessionMiddleware);
  api.use(buildApiRoutes({ authLimiter: authRateLimit(options.authRateLimit ?? env.AUTH_RATE_LIMIT), taggingRateLimit: options.taggingRateLimit }));
  api.use(notFoundHandler);
  app.use("/api", api);

  if (env.WEB_DIST) mountWebApp(app, env.WEB_DIST);
  app.use(notFoundHandler);
  app.use(errorMiddleware);
  return app;
}
