import { pino } from "pino";
import { env } from "@/config/env";

/**
 * The process logger: JSON lines on stdout. Request lines (pino-http) carry the headers, so the
 * credentials among them are replaced: a session cookie or an API token read from a log file
 * would let its reader act as that user or organization.
 */
export const logger = pino({
  level: env.NODE_ENV === "test" && env.LOG_LEVEL === "info" ? "silent" : env.LOG_LEVEL,
  redact: { paths: ["req.headers.cookie", "req.headers.authorization", 'res.headers["set-cookie"]', "req.query.token"], censor: "[redacted]" },
});

/**
 * Replaces the one-time secrets e-mailed links carry in their URL (`?token=` of the password-reset
 * and e-mail verification pages, the invitation token in `/invitations/<token>`) before a request
 * line is written: whoever reads the log could otherwise reset a password or take an invitation.
 */
export function redactUrlSecrets(url: string): string {
  return url.replace(/([?&]token=)[^&#]*/gi, "$1[redacted]").replace(/(\/invitations\/)[^/?#]+/gi, "$1[redacted]");
}

/** pino-http's request serializer on top of the standard one: the URL without its secrets. */
export function serializeRequest<T extends { url?: string }>(req: T): T {
  if (typeof req.url === "string") req.url = redactUrlSecrets(req.url);
  return req;
}
