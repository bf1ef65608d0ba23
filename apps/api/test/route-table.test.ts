import express, { type Express } from "express";
import { describe, expect, it } from "vitest";
import { z } from "zod";
import { createApp } from "@/app";
import { type RouteMeta, idParams, metaOf, noQuery, validate } from "@/security/route-meta";
import { routeCatalog } from "./support/route-catalog";
import type { TenantFixture } from "./support/tenant-fixture";

type Layer = { rawPath?: unknown; handle: unknown; route?: { path: string; methods: Record<string, boolean>; stack: Layer[] } };
type Found = { method: string; path: string; meta: RouteMeta };

/** Every route of the Express app, walking its router stack, with the metadata of every guard it passes. */
function routesOf(app: Express): Found[] {
  const out: Found[] = [];
  const walk = (stack: Layer[], prefix: string, inherited: RouteMeta[]) => {
    const seen = [...inherited];
    for (const layer of stack) {
      const own = metaOf(layer.handle);
      if (layer.route) {
        const metas = [...seen, ...layer.route.stack.map((l) => metaOf(l.handle)).filter((m): m is RouteMeta => !!m)];
        for (const [method, on] of Object.entries(layer.route.methods)) {
          if (on && method !== "_all") out.push({ method, path: `${prefix}${layer.route.path}`, meta: Object.assign({}, ...metas) as RouteMeta });
        }
        continue;
      }
      const inner = (layer.handle as { stack?: Layer[] }).stack;
      const mount = typeof layer.rawPath === "string" && layer.rawPath !== "/" ? layer.rawPath : "";
      if (inner) walk(inner, `${prefix}${mount}`, seen);
      else if (own) seen.push(own);
    }
  };
  walk((app as unknown as { router: { stack: Layer[] } }).router.stack, "", []);
  return out;
}

/** Routes anyone may call without a session or token: each one named on purpose. */
const PUBLIC = new Set([
  "get /api/health",
  "get /api/meta",
  "post /api/billing/webhook", // signed by the payments provider, checked with its SDK
  "get /api/dev/outbox", // development only (404 in production, outbox-production.test.ts)
  "get /api/dev/outbox/:id",
  "post /api/auth/sign-up",
  "post /api/auth/sign-in",
  "post /api/auth/sign-out",
  "get /api/auth/session", // {me: null} when signed out
  "get /api/me", // answers 401 itself when signed out
  "post /api/auth/password-reset/request",
  "post /api/auth/password-reset/confirm", // the e-mailed token is the credential
  "post /api/auth/verify-email", // the e-mailed token is the credential
  "get /api/invitations/:token", // the invitation token is the credential
]);

/**
 * Routes that do not validate their input with zod: the query on every route, the body on every
 * route but GET, and the params on every route with a path parameter (each parameter named in
 * the params object). The organization id is left out: orgScope checks it (a malformed one is
 * a 404, like an organization that does not exist).
 */
function unvalidated(found: readonly Found[]): string[] {
  const out: string[] = [];
  for (const r of found) {
    const input = r.meta.input;
    const missing: string[] = [];
    if (!input?.query) missing.push("query");
    if (r.method !== "get" && !input?.body) missing.push("body");
    const names = [...r.path.matchAll(/:([A-Za-z]+)/g)].map((m) => m[1]!).filter((n) => n !== "orgId");
    if (names.length) {
      const shape = input?.params instanceof z.ZodObject ? (input.params.shape as Record<string, unknown>) : {};
      const uncovered = names.filter((n) => !(n in shape));
      if (uncovered.length) missing.push(`params ${uncovered.join(", ")}`);
    }
    if (missing.length) out.push(`${r.method} ${r.path}: ${missing.join("; ")}`);
  }
  return out;
}

const norm = (p: string) => p.replace(/\?.*$/, "").replace(/:[A-Za-z]+/g, "*").replace(/\{[A-Za-z]+\}/g, "*").replace(/[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}/gi, "*").replace(/\/$/, "");
/** A fixture whose every id (at any depth, e.g. f.ids.corpusId) prints as {name}. */
const placeholder = (name: string): unknown =>
  new Proxy({}, { get: (_t, prop) => (prop === Symbol.toPrimitive ? () => `{${name}}` : placeholder(String(prop))) });
const placeholders = placeholder("fixture") as TenantFixture;

describe("route table", () => {
  const routes = routesOf(createApp());

  it("finds the routes from the app itself", () => {
    expect(routes.length).toBeGreaterThan(50);
  });

  it("every route is public by name, or requires a session or a token", () => {
    const open = routes.filter((r) => !r.meta.auth && !PUBLIC.has(`${r.method} ${r.path}`)).map((r) => `${r.method} ${r.path}`);
    expect(open).toEqual([]);
  });

  it("every tenant route declares its roles and is in the route catalog", () => {
    const catalog = new Set(routeCatalog.map((c) => `${c.method} ${norm(`/api${c.path(placeholders)}`)}`));
    const tenant = routes.filter((r) => r.path.startsWith("/api/orgs/:orgId/") || r.path === "/api/orgs/:orgId");
    expect(tenant.filter((r) => !r.meta.roles).map((r) => `${r.method} ${r.path}`)).toEqual([]);
    expect(tenant.filter((r) => !catalog.has(`${r.method} ${norm(r.path)}`)).map((r) => `${r.method} ${r.path}`)).toEqual([]);
  });

  it("the roles a tenant route lets through are the roles its catalog entry declares", () => {
    const declared = new Map(routeCatalog.map((c) => [`${c.method} ${norm(`/api${c.path(placeholders)}`)}`, [...new Set(["admin", ...c.roles])].sort()]));
    const differ = routes
      .filter((r) => Array.isArray(r.meta.roles) && declared.has(`${r.method} ${norm(r.path)}`))
      .map((r) => ({ route: `${r.method} ${r.path}`, app: [...new Set(["admin", ...(r.meta.roles as string[])])].sort(), catalog: declared.get(`${r.method} ${norm(r.path)}`) }))
      .filter((d) => JSON.stringify(d.app) !== JSON.stringify(d.catalog));
    expect(differ).toEqual([]);
  });

  it("every route validates its query, body and params with zod", () => {
    expect(unvalidated(routes)).toEqual([]);
  });

  it("the check finds a route added without validation, or with a parameter its schema leaves out", () => {
    const app = express();
    const r = express.Router();
    r.post("/things", (_req, res) => void res.end());
    r.get("/things/:thingId/parts/:partId", validate({ params: idParams("thingId"), query: noQuery }), (_req, res) => void res.end());
    r.get("/things", validate({ query: noQuery }), (_req, res) => void res.end());
    app.use("/api", r);
    expect(unvalidated(routesOf(app))).toEqual(["post /api/things: query; body", "get /api/things/:thingId/parts/:partId: params partId"]);
  });
});
