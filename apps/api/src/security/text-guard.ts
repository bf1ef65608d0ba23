import { isUtf8 } from "node:buffer";
import { findUnstorableText } from "@tagloom/contracts";
import type { Request, RequestHandler, Response } from "express";
import { ValidationError } from "@/errors";
import { unstorable } from "./route-meta";

/**
 * express.json's `verify` hook: a body that is not valid UTF-8 is refused (400) before it is
 * parsed, instead of being decoded with replacement characters and stored changed.
 */
export function refuseInvalidUtf8(_req: Request, _res: Response, buf: Buffer): void {
  if (!isUtf8(buf)) {
    throw new ValidationError("The request body is not valid UTF-8 text.", { fields: { _: ["Send the JSON body encoded as UTF-8."] } });
  }
}

/**
 * Refuses, for every route, a JSON body or query string holding text the database would refuse
 * (NUL, lone surrogates) or nesting deeper than the contracts allow: a 400 naming the field, and
 * nothing reaches a service. Multipart fields are checked by the upload route's own schemas.
 */
export const refuseUnstorableText: RequestHandler = (req, _res, next) => {
  const inQuery = findUnstorableText(req.query, "query");
  if (inQuery.length) throw unstorable(inQuery, "query");
  if (req.is("application/json")) {
    const inBody = findUnstorableText(req.body);
    if (inBody.length) throw unstorable(inBody, "request");
  }
  next();
};

/** Answers from the API are private to the caller: no shared or browser cache may keep them. */
export const noStore: RequestHandler = (_req, res, next) => {
  res.setHeader("Cache-Control", "no-store");
  next();
};
