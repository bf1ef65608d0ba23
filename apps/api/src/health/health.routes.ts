import { Router } from "express";
import type { Health } from "@tagloom/contracts";
import { isDatabaseUp } from "@/db/knex";
import { noQuery, validate } from "@/security/route-meta";

export const healthRouter = Router();

healthRouter.get("/health", validate({ query: noQuery }), async (_req, res) => {
  const up = await isDatabaseUp();
  const body: Health = { ok: up, db: up ? "up" : "down" };
  res.status(up ? 200 : 503).json(body);
});
