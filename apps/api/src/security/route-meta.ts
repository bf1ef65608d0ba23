import { findUnstorableText } from "@tagloom/contracts";
import type { Request, RequestHandler } from "express";
import { z } from "zod";
import { ValidationError, zodFieldErrors } from "@/errors";

/**
 * What a guard or validator declares about the routes it stands on. The markers are read back
 * from the Express router stack by the route-table test (apps/api/test/route-table.test.ts), so
 * every route's authentication, roles and input schemas are checkable from the app itself.
 */
export type RouteMeta = {
  /** How the caller is authenticated: a browser session or an organization's API token. */
  auth?: "session" | "token";
  /** The roles let through (admins always); "signed-in" for session routes outside an organization. */
  roles?: readonly string[] | "signed-in";
  /** The zod schemas the route validates its input with. */
  input?: InputSchemas;
};

export type InputSchemas = { params?: z.ZodType; query?: z.ZodType; body?: z.ZodType };

const META = Symbol.for("tagloom.routeMeta");

/** Attaches route metadata to a middleware (merged with what it already carries). */
export function withMeta<T extends RequestHandler>(handler: T, meta: RouteMeta): T {
  const own = (handler as unknown as Record<symbol, RouteMeta>)[META] ?? {};
  Object.defineProperty(handler, META, { value: { ...own, ...meta }, enumerable: false, configurable: true });
  return handler;
}

export function metaOf(handler: unknown): RouteMeta | undefined {
  return typeof handler === "function" ? (handler as unknown as Record<symbol, RouteMeta>)[META] : undefined;
}

/** A path parameter: an id or token as text; what it names is checked by the service (404). */
export const idParam = z.string().min(1).max(200);

/** The params schema of a route whose path parameters are all ids. */
export function idParams<K extends string>(...names: K[]): z.ZodObject<Record<K, typeof idParam>> {
  return z.object(Object.fromEntries(names.map((n) => [n, idParam])) as Record<K, typeof idParam>);
}

/** A route that takes no query parameters (unknown ones are ignored, as everywhere). */
export const noQuery = z.object({});
/** A route whose body is ignored: absent, or any JSON object. */
export const noBody = z.union([z.undefined(), z.object({}).loose()]);
/** A body that may be left out: absent counts as `{}` (the schema's defaults apply). */
export function bodyOrEmpty<T extends z.ZodType>(schema: T): z.ZodType<z.output<T>> {
  return z.preprocess((v) => v ?? {}, schema);
}
/** A raw body read as bytes (the payments webhook): its signature, not a schema, checks it. */
export const rawBody = z.union([z.undefined(), z.instanceof(Buffer)]);

const WHAT = { params: "path", query: "query", body: "request" } as const;
type Part = keyof typeof WHAT;

/** What validate parsed, per request, with the schema it parsed each part with. */
const parsedInput = new WeakMap<Request, Partial<Record<Part, { schema: z.ZodType; data: unknown }>>>();

/**
 * The value validate parsed from this part of the request (zod's output: defaults applied,
 * values coerced), so that a handler reads its input without parsing it a second time. Pass the
 * very schema object the route's validate was given; anything else is a wiring mistake and throws.
 */
export function validated<S extends z.ZodType>(req: Request, part: Part, schema: S): z.output<S> {
  const hit = parsedInput.get(req)?.[part];
  if (!hit || hit.schema !== schema) throw new Error(`${req.method} ${req.originalUrl.split("?")[0]}: the ${part} was not validated with this schema.`);
  return hit.data as z.output<S>;
}

/**
 * Validates a route's params, query and body with zod before the handler runs: a failure is a
 * 400 with field details and nothing else happens. Strings the database would refuse (NUL, lone
 * surrogates) are refused in every part. Declare it on every route, after the role guard.
 */
export function validate(schemas: InputSchemas): RequestHandler {
  return withMeta((req, _res, next) => {
    const parsed = { ...parsedInput.get(req) };
    for (const part of ["params", "query", "body"] as const) {
      const schema = schemas[part];
      const value: unknown = req[part];
      // Raw bytes are not text: only a parsed body or query can hold a string the database refuses.
      const problems = Buffer.isBuffer(value) ? [] : findUnstorableText(value, part === "body" ? "" : part);
      if (problems.length) throw unstorable(problems, WHAT[part]);
      if (!schema) continue;
      const result = schema.safeParse(value);
      if (!result.success) throw new ValidationError(`The ${WHAT[part]} is not valid.`, { fields: zodFieldErrors(result.error) });
      parsed[part] = { schema, data: result.data };
    }
    parsedInput.set(req, parsed);
    next();
  }, { input: schemas });
}

export function unstorable(problems: Array<{ path: string; message: string }>, what: string): ValidationError {
  const fields: Record<string, string[]> = {};
  for (const p of problems) (fields[p.path] ??= []).push(p.message);
  return new ValidationError(`The ${what} holds text that cannot be stored: ${problems[0]!.message}`, { fields });
}
