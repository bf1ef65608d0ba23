import type { ErrorRequestHandler, RequestHandler } from "express";
import { ZodError, z } from "zod";

/** An error a service throws on purpose: a stable code, an HTTP status and optional details. */
export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
    this.name = new.target.name;
  }
}

export class ValidationError extends AppError {
  constructor(message: string, details?: unknown) {
    super(400, "validation_failed", message, details);
  }
}
export class UnauthorizedError extends AppError {
  constructor(message = "Sign in to continue.") {
    super(401, "unauthenticated", message);
  }
}
export class ForbiddenError extends AppError {
  constructor(message = "Your role does not allow this.") {
    super(403, "forbidden", message);
  }
}
export class NotFoundError extends AppError {
  constructor(what = "resource") {
    super(404, "not_found", `No such ${what}.`);
  }
}
export class ConflictError extends AppError {
  constructor(message: string, details?: unknown, code = "conflict") {
    super(409, code, message, details);
  }
}
export class PayloadTooLargeError extends AppError {
  constructor(message: string, details?: unknown) {
    super(413, "too_large", message, details);
  }
}
export class UnprocessableError extends AppError {
  constructor(message: string, details?: unknown) {
    super(422, "unprocessable", message, details);
  }
}
export class RateLimitedError extends AppError {
  constructor(message = "Too many requests; try again later.") {
    super(429, "rate_limited", message);
  }
}

/** Field errors of a zod error as `{ "path.to.field": ["message", ...] }`. */
export function zodFieldErrors(err: ZodError): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const issue of err.issues) {
    const key = issue.path.length ? issue.path.join(".") : "_";
    (out[key] ??= []).push(issue.message);
  }
  return out;
}

/**
 * Parses with a schema; a failure becomes a 400 with field details. Routes do not call it: their
 * input is parsed once by `validate` and read with `validated` (security/route-meta.ts).
 */
export function parseOrThrow<T extends z.ZodType>(schema: T, value: unknown, what = "request"): z.infer<T> {
  const result = schema.safeParse(value);
  if (!result.success) throw new ValidationError(`The ${what} is not valid.`, { fields: zodFieldErrors(result.error) });
  return result.data;
}

export const notFoundHandler: RequestHandler = (req, _res, next) => {
  next(new AppError(404, "not_found", `No route for ${req.method} ${req.originalUrl.split("?")[0]}.`));
};

const CONNECTION_CODES = new Set(["ECONNREFUSED", "ECONNRESET", "ETIMEDOUT", "EPIPE", "EHOSTUNREACH", "ENOTFOUND"]);

/**
 * True when the error says the database cannot be reached or is restarting, rather than that a
 * query was wrong: connection refused or cut, SQLSTATE class 08 (connection exception) and 57P0x
 * (shutdown, crash, starting up), or no pooled connection within the acquire timeout.
 */
export function isDatabaseUnavailable(err: unknown): boolean {
  const e = err as { code?: unknown; name?: unknown; message?: unknown } | null;
  if (!e || typeof e !== "object") return false;
  const code = typeof e.code === "string" ? e.code : "";
  if (CONNECTION_CODES.has(code) || code.startsWith("08") || /^57P0[1-3]$/.test(code)) return true;
  if (e.name === "KnexTimeoutError") return true;
  // node-postgres reports a cut connection without a code, and Knex prefixes the message with
  // the SQL ("select … - Connection terminated unexpectedly"), so match after that prefix too.
  return typeof e.message === "string" && CONNECTION_LOST.test(e.message);
}

const CONNECTION_LOST = /(?:^| - )(?:Connection terminated|Client has encountered a connection error and is not queryable|Client was closed and is not queryable)/;

/** The one place errors become responses: `{ error: { code, message, details } }`. */
export const errorMiddleware: ErrorRequestHandler = (err, req, res, next) => {
  if (res.headersSent) {
    next(err);
    return;
  }
  if (err instanceof AppError) {
    res.status(err.status).json({ error: { code: err.code, message: err.message, details: err.details ?? null } });
    return;
  }
  if (err instanceof ZodError) {
    res.status(400).json({
      error: { code: "validation_failed", message: "The request is not valid.", details: { fields: zodFieldErrors(err) } },
    });
    return;
  }
  // body-parser and multer errors carry a status and a type; report them without internals.
  const status = typeof err?.status === "number" ? err.status : typeof err?.statusCode === "number" ? err.statusCode : 500;
  if (status === 413 || err?.type === "entity.too.large") {
    res.status(413).json({ error: { code: "too_large", message: "The request body is too large.", details: null } });
    return;
  }
  if (status >= 400 && status < 500) {
    const message = err?.type === "entity.parse.failed" ? "The request body is not valid JSON." : "The request is not valid.";
    res.status(status).json({ error: { code: "bad_request", message, details: null } });
    return;
  }
  if (isDatabaseUnavailable(err)) {
    req.log?.warn({ err }, "database unavailable");
    res.setHeader("Retry-After", "2");
    res.status(503).json({
      error: { code: "service_unavailable", message: "The service is briefly unavailable; nothing was changed. Try again in a moment.", details: null },
    });
    return;
  }
  req.log?.error({ err }, "unhandled error");
  res.status(500).json({
    error: { code: "internal", message: "Something went wrong on our side.", details: { requestId: req.id ?? null } },
  });
};
