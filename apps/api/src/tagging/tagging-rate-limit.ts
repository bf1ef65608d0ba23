import type { RequestHandler } from "express";
import { RateLimiterMemory, RateLimiterRes } from "rate-limiter-flexible";
import { env } from "@/config/env";
import { AppError, UnauthorizedError } from "@/errors";

export type TaggingRateLimit = { points: number; windowSeconds: number };

/**
 * Requests per API token per window (fixed window, counted in this process's memory: each API
 * process limits on its own, so N processes allow up to N times the limit). Over the limit the
 * answer is 429 with Retry-After in whole seconds.
 */
export function taggingRateLimit(limit: TaggingRateLimit = { points: env.TAGGING_RATE_LIMIT, windowSeconds: env.TAGGING_RATE_WINDOW_SECONDS }): RequestHandler {
  const limiter = new RateLimiterMemory({ points: limit.points, duration: limit.windowSeconds, keyPrefix: "tag" });
  return async (req, res, next) => {
    if (!req.apiToken) throw new UnauthorizedError();
    try {
      const r = await limiter.consume(req.apiToken.id);
      res.setHeader("RateLimit-Remaining", String(r.remainingPoints));
    } catch (err) {
      if (!(err instanceof RateLimiterRes)) throw err;
      const seconds = Math.max(1, Math.ceil(err.msBeforeNext / 1000));
      res.setHeader("Retry-After", String(seconds));
      throw new AppError(429, "rate_limited", `This token may make ${limit.points} tagging requests per ${limit.windowSeconds} s; try again in ${seconds} s.`, {
        retryAfterSeconds: seconds,
      });
    }
    next();
  };
}
