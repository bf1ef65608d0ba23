import type { RequestHandler } from "express";
import { env } from "@/config/env";
import { ForbiddenError } from "@/errors";

const SAFE = new Set(["GET", "HEAD", "OPTIONS"]);

function originOf(value: string | undefined): string | null {
  if (!value) return null;
  try {
    return new URL(value).origin;
  } catch {
    return null;
  }
}

/**
 * CSRF defence for cookie sessions: a state-changing request must come from a page of this
 * service, i.e. carry an Origin (or, failing that, a Referer) equal to the request's own host or
 * to PUBLIC_URL. Routes authenticated by bearer tokens or signed webhooks are exempt.
 */
export function originCheck(exemptPrefixes: readonly string[]): RequestHandler {
  const publicOrigin = new URL(env.publicUrl).origin;
  return (req, _res, next) => {
    if (SAFE.has(req.method) || exemptPrefixes.some((p) => req.originalUrl.startsWith(p))) return next();
    const rawOrigin = req.get("origin");
    const rawReferer = req.get("referer");
    const origin = originOf(rawOrigin) ?? (rawOrigin === undefined ? originOf(rawReferer) : null);
    const own = `${req.protocol}://${req.get("host")}`;
    if (origin && (origin === own || origin === publicOrigin)) return next();
    if (rawOrigin === undefined && rawReferer === undefined) {
      throw new ForbiddenError("The request has no Origin header; changes are accepted only from this service's own pages.");
    }
    // Printable ASCII only, and short: the header is the caller's text.
    const shown = (origin ?? rawOrigin ?? rawReferer ?? "").replace(/[^\x20-\x7e]/g, "?").slice(0, 100);
    throw new ForbiddenError(`Requests from origin "${shown}" are not allowed: changes are accepted only from this service's own pages.`);
  };
}
