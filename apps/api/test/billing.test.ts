import { type PaymentsFake, signPayload } from "@tagloom/fakes";
import Stripe from "stripe";
import request from "supertest";
import { beforeAll, describe, expect, it, vi } from "vitest";
import { db } from "@/db/knex";
import { type SignedIn, type TestServer, signUpFounder, startTestServer, uniqueEmail } from "./support/http";
import { testPayments } from "./support/payments";
import { tenantFingerprint } from "./support/tenant-fixture";

// A small free plan for this file (read by config/env.ts when the app is imported below).
vi.hoisted(() => {
  process.env.BILLING_FREE_SEATS = "3";
});

// Outside checks: the payments fake signs the way the provider documents, and the API verifies
// with the official SDK (stripe 23.1.0) `webhooks.constructEvent`; the expected final states are
// read back from the fake through the same SDK, not from our own tables.
let server: TestServer;
let fake: PaymentsFake;
let sdk: Stripe;

beforeAll(async () => {
  server = await startTestServer();
  fake = testPayments(server);
  sdk = new Stripe("sk_test_tagloom_local", { host: "127.0.0.1", port: fake.port, protocol: "http", maxNetworkRetries: 0, telemetry: false });
});

const invite = (admin: SignedIn, email = uniqueEmail("invitee")) => admin.agent.post(`/api/orgs/${admin.orgId}/invitations`).send({ email, role: "annotator" });
const billing = async (admin: SignedIn) => {
  const res = await admin.agent.get(`/api/orgs/${admin.orgId}/billing`);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body;
};

async function waitForLockWaiters(n: number): Promise<void> {
  for (let i = 0; i < 200; i++) {
    const r = await db.raw("SELECT count(*)::int AS n FROM pg_stat_activity WHERE datname = current_database() AND wait_event_type = 'Lock'");
    if (r.rows[0].n >= n) return;
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
  throw new Error(`fewer than ${n} requests waiting on the organization's row`);
}

/** An organization that bought `seats` seats through checkout, with every webhook delivered. */
async function paidOrganization(name: string, seats: number): Promise<{ admin: SignedIn; subscriptionId: string }> {
  const admin = await signUpFounder(server, { organizationName: name });
  const started = await admin.agent.post(`/api/orgs/${admin.orgId}/billing/checkout`).send({ seats });
  expect(started.status, JSON.stringify(started.body)).toBe(201);
  const paid = fake.payCheckout(started.body.checkoutId);
  expect(paid.ok).toBe(true);
  await fake.settled();
  const session = await sdk.checkout.sessions.retrieve(started.body.checkoutId);
  return { admin, subscriptionId: String(session.subscription) };
}

describe("seats on the free plan", () => {
  it("counts members and pending invitations, and refuses an invitation beyond the seats with 402", async () => {
    const admin = await signUpFounder(server, { organizationName: "Saltmarsh Ledger" });
    expect((await invite(admin)).status).toBe(201);
    expect((await invite(admin)).status).toBe(201);
    const before = await tenantFingerprint(admin.orgId);
    const refused = await invite(admin);
    expect(refused.status).toBe(402);
    expect(refused.body.error.code).toBe("seat_limit_reached");
    expect(refused.body.error.message).toMatch(/All 3 seats are in use \(1 member and 2 pending invitations\).*Billing page/);
    expect(refused.body.error.details).toEqual({ seatsUsed: 3, seatLimit: 3, plan: "free" });
    expect(await tenantFingerprint(admin.orgId)).toEqual(before);
    expect(await billing(admin)).toMatchObject({ plan: "free", freeSeats: 3, seatLimit: 3, seatsUsed: 3, members: 1, pendingInvitations: 2, subscription: null });
  });

  it("invitations racing for the last seat: exactly one gets it", async () => {
    const admin = await signUpFounder(server, { organizationName: "Tinwhistle Forms" });
    expect((await invite(admin)).status).toBe(201);
    // Hold the organization's row so that all three requests are inside their transactions at
    // the same moment, then let them go together.
    const holder = await db.transaction();
    await holder.raw("SELECT id FROM organizations WHERE id = ? FOR UPDATE", [admin.orgId]);
    const racing = Promise.all([invite(admin), invite(admin), invite(admin)]);
    await waitForLockWaiters(3);
    await holder.commit();
    const results = await racing;
    expect(results.map((r) => r.status).sort()).toEqual([201, 402, 402]);
    expect((await db("invitations").where({ organization_id: admin.orgId }).count<{ count: string }[]>("id"))[0]!.count).toEqual(2);
  });

  it("refuses a checkout that would not cover the free plan or the seats in use", async () => {
    const admin = await signUpFounder(server, { organizationName: "Pebblegate Notes" });
    const res = await admin.agent.post(`/api/orgs/${admin.orgId}/billing/checkout`).send({ seats: 3 });
    expect(res.status).toBe(409);
    expect(res.body.error).toMatchObject({ code: "too_few_seats", details: { minimum: 4 } });
    expect((await admin.agent.post(`/api/orgs/${admin.orgId}/billing/checkout`).send({ seats: 2.5 })).status).toBe(400);
  });
});

describe("checkout → pay on the fake → signed webhooks → seats", () => {
  it("raises the seats only when the webhook confirms the payment, then the invitation goes through", async () => {
    const admin = await signUpFounder(server, { organizationName: "Quartzline Archive" });
    await invite(admin);
    await invite(admin);
    expect((await invite(admin)).status).toBe(402);

    fake.setDeliveryMode("manual");
    try {
      const started = await admin.agent.post(`/api/orgs/${admin.orgId}/billing/checkout`).send({ seats: 6 });
      expect(started.status, JSON.stringify(started.body)).toBe(201);
      expect(started.body.url).toBe(`${fake.url}/pay/${started.body.checkoutId}`);
      const page = await fetch(started.body.url);
      expect(await page.text()).toContain("LOCAL TEST PAYMENT PAGE");
      const paid = await fetch(started.body.url, { method: "POST", redirect: "manual" });
      expect(paid.status).toBe(303);
      expect(paid.headers.get("location")).toContain(`/o/${admin.orgId}/billing?checkout=returned`);

      // Paid on the hosted page and back in the browser, but not yet confirmed by a webhook:
      // nothing changed.
      expect(await billing(admin)).toMatchObject({ plan: "free", seatLimit: 3, checkoutPending: true });
      expect((await invite(admin)).status).toBe(402);

      const deliveries = await fake.deliverHeld();
      expect(deliveries.map((d) => [d.type, d.status])).toEqual([
        ["customer.subscription.created", 200],
        ["invoice.paid", 200],
        ["checkout.session.completed", 200],
      ]);
    } finally {
      fake.setDeliveryMode("auto");
    }
    const state = await billing(admin);
    expect(state).toMatchObject({ plan: "per_seat", seatLimit: 6, seatsUsed: 3, checkoutPending: false, paymentFailed: false });
    expect(state.subscription).toMatchObject({ status: "active", seats: 6, cancelAtPeriodEnd: false, seatPrice: 900, currency: "eur" });
    expect(state.nextInvoiceAt).toBe(state.subscription.currentPeriodEnd);
    expect(state.invoices).toHaveLength(1);
    expect(state.invoices[0]).toMatchObject({ status: "paid", amountDue: 6 * 900, amountPaid: 6 * 900 });
    expect((await invite(admin)).status).toBe(201);

    const audit = await admin.agent.get(`/api/orgs/${admin.orgId}/audit`);
    const actions = audit.body.items.map((e: { action: string }) => e.action);
    expect(actions).toEqual(expect.arrayContaining(["billing.checkout_started", "billing.subscription_updated", "billing.checkout_paid"]));
  });
});

describe("webhook integrity", () => {
  it("a forged, tampered or unsigned event answers 400 and changes nothing", async () => {
    const { admin, subscriptionId } = await paidOrganization("Glimmerfold Cases", 5);
    const customerId = (await db("billing_accounts").where({ organization_id: admin.orgId }).first()).customer_id;
    const before = await tenantFingerprint(admin.orgId);
    const forged = JSON.stringify({
      id: "evt_forged_1",
      object: "event",
      type: "customer.subscription.deleted",
      data: { object: { id: subscriptionId, object: "subscription", customer: customerId, status: "canceled" } },
    });
    const hook = () => request(server.url).post("/api/billing/webhook").set("Content-Type", "application/json");
    const wrongSecret = await hook().set("Stripe-Signature", signPayload(forged, "whsec_not_ours")).send(forged);
    expect(wrongSecret.status).toBe(400);
    expect(wrongSecret.body.error.code).toBe("bad_signature");
    const signedOther = signPayload('{"id":"evt_x"}', "whsec_tagloom_local");
    expect((await hook().set("Stripe-Signature", signedOther).send(forged)).status).toBe(400);
    expect((await hook().send(forged)).status).toBe(400);
    expect((await hook().set("Stripe-Signature", "t=1,v1=00").send("not json")).status).toBe(400);
    expect(await tenantFingerprint(admin.orgId)).toEqual(before);
    expect(await db("billing_webhook_events").where({ id: "evt_forged_1" }).first()).toBeUndefined();
  });

  it("a replayed event is acknowledged and changes nothing", async () => {
    const { admin } = await paidOrganization("Harrowgate Files", 4);
    const event = fake.events().find((e) => e.type === "checkout.session.completed" && e.payload.includes(admin.orgId))!;
    const before = await tenantFingerprint(admin.orgId);
    const again = await fake.redeliver(event.id);
    expect(again.status).toBe(200);
    const direct = await request(server.url)
      .post("/api/billing/webhook")
      .set("Content-Type", "application/json")
      .set("Stripe-Signature", signPayload(event.payload, "whsec_tagloom_local"))
      .send(event.payload);
    expect(direct.status).toBe(200);
    expect(direct.body).toEqual({ received: true, duplicate: true });
    expect(await tenantFingerprint(admin.orgId)).toEqual(before);
  });

  it("events delivered in reverse order end in the payments service's current state", async () => {
    const admin = await signUpFounder(server, { organizationName: "Wickerlane Desk" });
    fake.setDeliveryMode("manual");
    let subscriptionId = "";
    try {
      const started = await admin.agent.post(`/api/orgs/${admin.orgId}/billing/checkout`).send({ seats: 5 });
      fake.payCheckout(started.body.checkoutId);
      subscriptionId = String((await sdk.checkout.sessions.retrieve(started.body.checkoutId)).subscription);
      const sub = await sdk.subscriptions.retrieve(subscriptionId);
      await sdk.subscriptions.update(subscriptionId, { items: [{ id: sub.items.data[0]!.id, quantity: 8 }], proration_behavior: "always_invoice" });
      const delivered = await fake.deliverHeld("reverse");
      expect(delivered.map((d) => d.type)).toEqual(["invoice.paid", "customer.subscription.updated", "checkout.session.completed", "invoice.paid", "customer.subscription.created"]);
      expect(delivered.every((d) => d.status === 200)).toBe(true);
    } finally {
      fake.setDeliveryMode("auto");
    }
    const truth = await sdk.subscriptions.retrieve(subscriptionId);
    let state = await billing(admin);
    expect(state.subscription).toMatchObject({ status: truth.status, seats: truth.items.data[0]!.quantity });
    expect(state).toMatchObject({ plan: "per_seat", seatLimit: 8, checkoutPending: false });
    expect(state.invoices.map((i: { amountDue: number }) => i.amountDue).sort()).toEqual([3 * 900, 5 * 900].sort());

    // Cancelled at period end, and the period ends: the deletion arrives before the update.
    fake.setDeliveryMode("manual");
    try {
      await sdk.subscriptions.update(subscriptionId, { cancel_at_period_end: true });
      fake.endPeriod(subscriptionId);
      expect((await fake.deliverHeld("reverse")).map((d) => d.type)).toEqual(["customer.subscription.deleted", "customer.subscription.updated"]);
    } finally {
      fake.setDeliveryMode("auto");
    }
    state = await billing(admin);
    expect(state).toMatchObject({ plan: "free", seatLimit: 3, nextInvoiceAt: null });
    expect(state.subscription.status).toBe("canceled");
  });
});

describe("changing a paid subscription", () => {
  it("changes seats (never below those in use), cancels at period end and takes that back", async () => {
    const { admin } = await paidOrganization("Larchmere Registry", 5);
    await invite(admin);
    await invite(admin);
    const below = await admin.agent.post(`/api/orgs/${admin.orgId}/billing/seats`).send({ seats: 2 });
    expect(below.status).toBe(409);
    expect(below.body.error.code).toBe("seats_in_use");
    expect(below.body.error.message).toMatch(/3 seats are in use \(1 member and 2 pending invitations\)/);

    const more = await admin.agent.post(`/api/orgs/${admin.orgId}/billing/seats`).send({ seats: 7 });
    expect(more.status, JSON.stringify(more.body)).toBe(200);
    expect(more.body).toMatchObject({ seatLimit: 7, subscription: { seats: 7 } });
    await fake.settled();
    const fewer = await admin.agent.post(`/api/orgs/${admin.orgId}/billing/seats`).send({ seats: 3 });
    expect(fewer.body).toMatchObject({ seatLimit: 3 });
    expect((await invite(admin)).status).toBe(402);

    const cancel = await admin.agent.post(`/api/orgs/${admin.orgId}/billing/cancel`);
    expect(cancel.body).toMatchObject({ plan: "per_seat", nextInvoiceAt: null, subscription: { cancelAtPeriodEnd: true } });
    const resume = await admin.agent.post(`/api/orgs/${admin.orgId}/billing/resume`);
    expect(resume.body.subscription.cancelAtPeriodEnd).toBe(false);
    await fake.settled();
    const actions = (await admin.agent.get(`/api/orgs/${admin.orgId}/audit`)).body.items.map((e: { action: string }) => e.action);
    expect(actions).toEqual(expect.arrayContaining(["billing.seats_changed", "billing.cancel_scheduled", "billing.cancel_withdrawn"]));
  });

  it("a declined renewal shows the failure, keeps the seats until the period ends, and a retry clears it", async () => {
    const { admin, subscriptionId } = await paidOrganization("Thistledown Studio", 5);
    fake.setFailPayments(true);
    try {
      fake.endPeriod(subscriptionId);
      await fake.settled();
      let state = await billing(admin);
      expect(state).toMatchObject({ plan: "per_seat", seatLimit: 5, paymentFailed: true, subscription: { status: "past_due" } });
      expect((await invite(admin)).status).toBe(201);
      const declined = await admin.agent.post(`/api/orgs/${admin.orgId}/billing/retry-payment`);
      expect(declined.status).toBe(402);
      expect(declined.body.error.code).toBe("payment_declined");
      state = await billing(admin);
      expect(state.paymentFailed).toBe(true);
    } finally {
      fake.setFailPayments(false);
    }
    const retried = await admin.agent.post(`/api/orgs/${admin.orgId}/billing/retry-payment`);
    expect(retried.status, JSON.stringify(retried.body)).toBe(200);
    expect(retried.body).toMatchObject({ paymentFailed: false, subscription: { status: "active" } });
    expect(retried.body.invoices.map((i: { status: string }) => i.status)).toEqual(["paid", "paid"]);
    await fake.settled();
  });

  it("past due after the paid period has ended: back to the free plan's seats", async () => {
    const { admin, subscriptionId } = await paidOrganization("Brambleworth Rolls", 5);
    fake.setFailPayments(true);
    try {
      fake.endPeriod(subscriptionId);
      await fake.settled();
    } finally {
      fake.setFailPayments(false);
    }
    await db("billing_accounts").where({ organization_id: admin.orgId }).update({ current_period_end: new Date(Date.now() - 1000) });
    expect(await billing(admin)).toMatchObject({ plan: "free", seatLimit: 3, paymentFailed: true });
  });

  it("deleting a paying organization ends its subscription at the payments service", async () => {
    const { admin, subscriptionId } = await paidOrganization("Copperbeech Index", 4);
    const res = await admin.agent.delete(`/api/orgs/${admin.orgId}`).send({ confirmName: "Copperbeech Index" });
    expect(res.status, JSON.stringify(res.body)).toBe(204);
    expect((await sdk.subscriptions.retrieve(subscriptionId)).status).toBe("canceled");
    await fake.settled();
    expect(fake.deliveries().filter((d) => d.type === "customer.subscription.deleted").at(-1)?.status).toBe(200);
  });
});
