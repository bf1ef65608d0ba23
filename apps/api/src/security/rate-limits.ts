import type { RequestHandler } from "express";
import { RateLimiterPostgres, RateLimiterRes } from "rate-limiter-flexible";
import { pgPool } from "@/db/pg-pool";
import { RateLimitedError } from "@/errors";

/**
 * A per-address limit for the account routes an attacker would hammer (sign-in, sign-up, reset).
 * The counters live in PostgreSQL (table auth_rate_limits), so every API process behind a proxy
 * counts against the same limit. The address is req.ip, which believes X-Forwarded-For only from
 * the proxies TRUST_PROXY names. Limiters with different limits keep separate counters.
 */
export function authRateLimit(limit: number, windowMs = 15 * 60 * 1000): RequestHandler {
  const limiter = new RateLimiterPostgres({
    storeClient: pgPool,
    storeType: "pool",
    tableName: "auth_rate_limits",
    tableCreated: true,
    keyPrefix: `auth:${limit}:${windowMs}`,
    points: limit,
    duration: Math.ceil(windowMs / 1000),
  });
  return async (req, res, next) => {
    try {
      const used = await limiter.consume(req.ip ?? "unknown");
      res.setHeader("RateLimit-Policy", `${limit};w=${Math.ceil(windowMs / 1000)}`);
      res.setHeader("RateLimit", `limit=${limit}, remaining=${used.remainingPoints}, reset=${Math.ceil(used.msBeforeNext / 1000)}`);
    } catch (err) {
      if (!(err instanceof RateLimiterRes)) throw err;
      res.setHeader("Retry-After", String(Math.ceil(err.msBeforeNext / 1000)));
      throw new RateLimitedError("Too many attempts from this address; wait a few minutes and try again.");
    }
    next();
  };
}
