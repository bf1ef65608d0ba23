import { pino } from "pino";
import { env } from "@/config/env";

/**
 * The process logger: JSON lines on stdout. Request lines (pino-http) carry the headers, so the
 * credentials among them are replaced: a session cookie or an API token read from a log file
 * would let its reader act as that user or organization.
 */
export const logger = pino({
  level: env.NODE_ENV === "test" && env.LOG_LEVEL === "info" ? "silent" : env.LOG_LEVEL,
  redact: { paths: ["req.headers.cookie", "req.headers.authorization", 'res.headers["set-cookie"]'], censor: "[redacted]" },
});
