import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import type { Request } from "express";
import { describe, expect, it } from "vitest";
import { z } from "zod";
import { ValidationError } from "@/errors";
import { validate, validated } from "@/security/route-meta";

const SRC = path.resolve(import.meta.dirname, "../src");
const routeFiles = readdirSync(SRC, { recursive: true, encoding: "utf8" })
  .filter((f) => f.endsWith(".routes.ts"))
  .map((f) => ({ file: f, text: readFileSync(path.join(SRC, f), "utf8") }));

/** Runs a validate middleware on a bare request; returns the request (or throws what it threw). */
function run(handler: ReturnType<typeof validate>, parts: { params?: unknown; query?: unknown; body?: unknown }): Request {
  const req = { method: "POST", originalUrl: "/api/test?x=1", params: {}, query: {}, ...parts } as unknown as Request;
  let passed = false;
  handler(req, {} as never, () => (passed = true));
  expect(passed).toBe(true);
  return req;
}

describe("each route parses its input once", () => {
  it("validated hands over what validate parsed, defaults applied, without parsing again", () => {
    let parses = 0;
    const body = z.object({ name: z.string(), seats: z.number().default(3) }).transform((v) => {
      parses++;
      return v;
    });
    const query = z.object({ limit: z.coerce.number().default(50) });
    const req = run(validate({ query, body }), { query: { limit: "7" }, body: { name: "Orrel" } });
    expect(parses).toBe(1);
    expect(validated(req, "body", body)).toEqual({ name: "Orrel", seats: 3 });
    expect(validated(req, "query", query)).toEqual({ limit: 7 });
    expect(parses).toBe(1);
  });

  it("a refused body still stops in validate with a 400's field details", () => {
    const body = z.object({ name: z.string().min(1) });
    const req = { method: "POST", originalUrl: "/api/test", params: {}, query: {}, body: { name: "" } } as unknown as Request;
    expect(() => validate({ body })(req, {} as never, () => undefined)).toThrow(ValidationError);
    expect(() => validated(req, "body", body)).toThrow(/was not validated/);
  });

  it("asking with another schema than the route validated with is a wiring mistake and throws", () => {
    const body = z.object({ name: z.string() });
    const req = run(validate({ body }), { body: { name: "Orrel" } });
    expect(() => validated(req, "body", z.object({ name: z.string() }))).toThrow(/POST \/api\/test: the body was not validated with this schema/);
    expect(() => validated(req, "query", body)).toThrow(/the query was not validated/);
  });

  it("no route parses its input itself", () => {
    expect(routeFiles.length).toBeGreaterThan(10);
    for (const { file, text } of routeFiles) {
      expect(text, file).not.toMatch(/parseOrThrow\(|\.safeParse\(req\.|\.parse\(req\./);
    }
  });

  it("every validated(req, part, schema) in a route file reads a schema its route's validate was given", () => {
    let reads = 0;
    for (const { file, text } of routeFiles) {
      for (const m of text.matchAll(/validated\(req, "(params|query|body)", (\w+)\)/g)) {
        reads++;
        const at = text.lastIndexOf("validate({", m.index);
        expect(at, `${file}: ${m[0]} has no validate before it`).toBeGreaterThanOrEqual(0);
        const declared = text.slice(at, text.indexOf("})", at));
        expect(declared, `${file}: ${m[0]}`).toMatch(new RegExp(`\\b${m[1]}: ${m[2]}\\b`));
      }
    }
    // The routes that take a body or a query read it through validated (counted when written).
    expect(reads).toBeGreaterThanOrEqual(40);
  });
});
