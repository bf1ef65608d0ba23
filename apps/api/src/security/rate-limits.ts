import type { RequestHandler } from "express";
import { rateLimit } from "express-rate-limit";
import { RateLimitedError } from "@/errors";

/**
 * A per-address limit for the account routes an attacker would hammer (sign-in, sign-up, reset).
 * The counter lives in this process's memory: each API process limits on its own.
 */
export function authRateLimit(limit: number, windowMs = 15 * 60 * 1000): RequestHandler {
  return rateLimit({
    windowMs,
    limit,
    standardHeaders: "draft-8",
    legacyHeaders: false,
    // The trusted proxies are set explicitly (TRUST_PROXY); a forwarded header from anyone else is
    // ignored on purpose, not a misconfiguration to warn about.
    validate: { xForwardedForHeader: false, trustProxy: false },
    handler: (_req, _res, next) => next(new RateLimitedError("Too many attempts from this address; wait a few minutes and try again.")),
  });
}
