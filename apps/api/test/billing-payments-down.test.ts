import { signPayload } from "@tagloom/fakes";
import request from "supertest";
import { beforeAll, describe, expect, it, vi } from "vitest";
import { db } from "@/db/knex";
import { type TestServer, signUpFounder, startTestServer } from "./support/http";
import { tenantFingerprint } from "./support/tenant-fixture";

// The payments service is down: the SDK is pointed at a port where nothing listens (taken and
// released before the app reads its environment).
await vi.hoisted(async () => {
  const net = await import("node:net");
  const probe = net.createServer();
  await new Promise<void>((resolve) => probe.listen(0, "127.0.0.1", () => resolve()));
  const { port } = probe.address() as import("node:net").AddressInfo;
  await new Promise<void>((resolve) => probe.close(() => resolve()));
  process.env.STRIPE_API_PORT = String(port);
  process.env.BILLING_FREE_SEATS = "3";
});

let server: TestServer;
beforeAll(async () => {
  server = await startTestServer();
});

describe("payments service down", () => {
  it("a checkout answers a clear 503 and leaves nothing half-made", async () => {
    const admin = await signUpFounder(server, { organizationName: "Foxglove Minutes" });
    const before = await tenantFingerprint(admin.orgId);
    const res = await admin.agent.post(`/api/orgs/${admin.orgId}/billing/checkout`).send({ seats: 6 });
    expect(res.status).toBe(503);
    expect(res.body.error).toMatchObject({ code: "payments_unavailable", message: expect.stringMatching(/cannot be reached.*Nothing was changed/) });
    expect(await tenantFingerprint(admin.orgId)).toEqual(before);
    const state = await admin.agent.get(`/api/orgs/${admin.orgId}/billing`);
    expect(state.status).toBe(200);
    expect(state.body).toMatchObject({ plan: "free", seatLimit: 3, checkoutPending: false, subscription: null });
  });

  it("a signed webhook that cannot be checked against the service is refused unrecorded, so a redelivery works later", async () => {
    const admin = await signUpFounder(server, { organizationName: "Juniper Hollow Desk" });
    await db("billing_accounts").insert({ organization_id: admin.orgId, customer_id: "cus_down_1" });
    const before = await tenantFingerprint(admin.orgId);
    const payload = JSON.stringify({
      id: "evt_down_1",
      object: "event",
      type: "customer.subscription.updated",
      data: { object: { id: "sub_down_1", object: "subscription", customer: "cus_down_1", status: "active" } },
    });
    const res = await request(server.url)
      .post("/api/billing/webhook")
      .set("Content-Type", "application/json")
      .set("Stripe-Signature", signPayload(payload, "whsec_tagloom_local"))
      .send(payload);
    expect(res.status).toBe(503);
    expect(await db("billing_webhook_events").where({ id: "evt_down_1" }).first()).toBeUndefined();
    expect(await tenantFingerprint(admin.orgId)).toEqual(before);
  });
});
