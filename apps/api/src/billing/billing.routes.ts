import { changeSeatsInputSchema, startCheckoutInputSchema } from "@tagloom/contracts";
import express, { Router } from "express";
import { actorOf, allow, memberOf } from "@/orgs/org-access";
import { changeSeats, getBillingState, retryPayment, setCancelAtPeriodEnd, startCheckout } from "./billing.service";
import { handleWebhook } from "./billing.webhooks";
import { noBody, noQuery, rawBody, validate, validated } from "@/security/route-meta";

/** Admin routes below /orgs/:orgId. */
export const billingRouter = Router({ mergeParams: true });

billingRouter.get("/billing", allow(), validate({ query: noQuery }), async (req, res) => {
  res.json(await getBillingState(memberOf(req).organizationId));
});

billingRouter.post("/billing/checkout", allow(), validate({ query: noQuery, body: startCheckoutInputSchema }), async (req, res) => {
  const { seats } = validated(req, "body", startCheckoutInputSchema);
  res.status(201).json(await startCheckout(memberOf(req).organizationId, seats, actorOf(req)));
});

billingRouter.post("/billing/seats", allow(), validate({ query: noQuery, body: changeSeatsInputSchema }), async (req, res) => {
  const { seats } = validated(req, "body", changeSeatsInputSchema);
  res.json(await changeSeats(memberOf(req).organizationId, seats, actorOf(req)));
});

billingRouter.post("/billing/cancel", allow(), validate({ query: noQuery, body: noBody }), async (req, res) => {
  res.json(await setCancelAtPeriodEnd(memberOf(req).organizationId, true, actorOf(req)));
});

billingRouter.post("/billing/resume", allow(), validate({ query: noQuery, body: noBody }), async (req, res) => {
  res.json(await setCancelAtPeriodEnd(memberOf(req).organizationId, false, actorOf(req)));
});

billingRouter.post("/billing/retry-payment", allow(), validate({ query: noQuery, body: noBody }), async (req, res) => {
  res.json(await retryPayment(memberOf(req).organizationId, actorOf(req)));
});

/**
 * The payments service's webhook. Mounted before the JSON parser: the signature covers the exact
 * bytes, so this route alone reads the body raw.
 */
export const billingWebhookRouter = Router();

billingWebhookRouter.post("/billing/webhook", express.raw({ type: () => true, limit: "1mb" }), validate({ query: noQuery, body: rawBody }), async (req, res) => {
  const raw = Buffer.isBuffer(req.body) ? req.body : Buffer.alloc(0);
  res.json(await handleWebhook(raw, req.get("stripe-signature")));
});
