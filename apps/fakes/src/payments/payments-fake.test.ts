import http from "node:http";
import type { AddressInfo } from "node:net";
import Stripe from "stripe";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { parseFormBody } from "./form-body";
import { type PaymentsFake, startPaymentsFake } from "./payments-fake";

// The outside check: the official SDK (stripe 23.1.0) makes the requests and verifies the
// webhook signatures with its own `webhooks.constructEvent`; none of our code checks them.
const SECRET = "whsec_fake_test_secret";
let fake: PaymentsFake;
let sdk: Stripe;
let receiver: http.Server;
const received: { header: string; body: string }[] = [];

beforeAll(async () => {
  receiver = http.createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on("data", (c: Buffer) => chunks.push(c));
    req.on("end", () => {
      received.push({ header: String(req.headers["stripe-signature"]), body: Buffer.concat(chunks).toString("utf8") });
      res.writeHead(200).end("{}");
    });
  });
  await new Promise<void>((r) => receiver.listen(0, "127.0.0.1", () => r()));
  fake = await startPaymentsFake({ webhookSecret: SECRET, webhookUrl: `http://127.0.0.1:${(receiver.address() as AddressInfo).port}/hook` });
  sdk = new Stripe("sk_test_tagloom_local", { host: "127.0.0.1", port: fake.port, protocol: "http", maxNetworkRetries: 0, telemetry: false });
});
afterAll(async () => {
  await fake.stop();
  receiver.closeAllConnections();
  await new Promise<void>((r) => receiver.close(() => r()));
});

function verifiedEvents(): Stripe.Event[] {
  return received.map((r) => sdk.webhooks.constructEvent(r.body, r.header, SECRET));
}

describe("payments fake", () => {
  it("parses the SDK's bracketed form encoding", () => {
    expect(parseFormBody("line_items[0][price]=p1&line_items[0][quantity]=3&metadata[organizationId]=o&mode=subscription")).toEqual({
      line_items: [{ price: "p1", quantity: "3" }],
      metadata: { organizationId: "o" },
      mode: "subscription",
    });
  });

  it("checkout → pay → signed events the SDK verifies; seat change and a declined retry", async () => {
    const customer = await sdk.customers.create({ name: "Quillmark Studio", metadata: { organizationId: "org-1" } });
    const session = await sdk.checkout.sessions.create({
      mode: "subscription",
      customer: customer.id,
      line_items: [{ price: "price_tagloom_seat", quantity: 7 }],
      success_url: "http://127.0.0.1:1/done?s={CHECKOUT_SESSION_ID}",
      cancel_url: "http://127.0.0.1:1/back",
      subscription_data: { metadata: { organizationId: "org-1" } },
    });
    expect(session.url).toBe(`${fake.url}/pay/${session.id}`);
    const page = await fetch(session.url!);
    expect(await page.text()).toContain("LOCAL TEST PAYMENT PAGE");

    const paid = await fetch(session.url!, { method: "POST", redirect: "manual" });
    expect(paid.status).toBe(303);
    expect(paid.headers.get("location")).toBe(`http://127.0.0.1:1/done?s=${session.id}`);
    await fake.settled();
    const events = verifiedEvents();
    expect(events.map((e) => e.type)).toEqual(["customer.subscription.created", "invoice.paid", "checkout.session.completed"]);

    const completed = events[2]!.data.object as Stripe.Checkout.Session;
    const sub = await sdk.subscriptions.retrieve(String(completed.subscription));
    expect(sub.status).toBe("active");
    expect(sub.metadata.organizationId).toBe("org-1");
    expect(sub.items.data[0]!.quantity).toBe(7);
    expect(sub.items.data[0]!.current_period_end).toBeGreaterThan(sub.start_date);

    const updated = await sdk.subscriptions.update(sub.id, { items: [{ id: sub.items.data[0]!.id, quantity: 9 }], proration_behavior: "always_invoice" });
    expect(updated.items.data[0]!.quantity).toBe(9);
    const invoices = await sdk.invoices.list({ customer: customer.id, limit: 10 });
    expect(invoices.data.map((i) => i.amount_due)).toEqual([2 * 900, 7 * 900]);

    // A declined renewal leaves an open invoice and a past-due subscription; paying it once the
    // switch is off makes the subscription active again.
    fake.setFailPayments(true);
    fake.endPeriod(sub.id);
    const open = (await sdk.invoices.list({ customer: customer.id })).data[0]!;
    expect(open.status).toBe("open");
    expect((await sdk.subscriptions.retrieve(sub.id)).status).toBe("past_due");
    await expect(sdk.invoices.pay(open.id)).rejects.toMatchObject({ type: "StripeCardError", code: "card_declined" });
    fake.setFailPayments(false);
    expect((await sdk.invoices.pay(open.id)).status).toBe("paid");
    expect((await sdk.subscriptions.retrieve(sub.id)).status).toBe("active");

    await sdk.subscriptions.update(sub.id, { cancel_at_period_end: true });
    fake.endPeriod(sub.id);
    await fake.settled();
    const types = verifiedEvents().map((e) => e.type);
    expect(types.slice(3)).toEqual([
      "customer.subscription.updated",
      "invoice.paid",
      "customer.subscription.updated",
      "invoice.payment_failed",
      "customer.subscription.updated",
      "invoice.payment_failed",
      "invoice.paid",
      "customer.subscription.updated",
      "customer.subscription.updated",
      "customer.subscription.deleted",
    ]);
    expect((await sdk.subscriptions.retrieve(sub.id)).status).toBe("canceled");
  });

  it("answers unknown objects and bad keys the way the SDK reports them", async () => {
    await expect(sdk.subscriptions.retrieve("sub_missing")).rejects.toMatchObject({ type: "StripeInvalidRequestError", statusCode: 404 });
    const wrongKey = new Stripe("sk_test_wrong", { host: "127.0.0.1", port: fake.port, protocol: "http", maxNetworkRetries: 0, telemetry: false });
    await expect(wrongKey.customers.create({})).rejects.toMatchObject({ type: "StripeAuthenticationError", statusCode: 401 });
  });

  it("a tampered or wrongly signed event fails the SDK's verification", async () => {
    const r = received[0]!;
    expect(() => sdk.webhooks.constructEvent(r.body.replace("invoice", "invoicf"), r.header, SECRET)).toThrow();
    expect(() => sdk.webhooks.constructEvent(r.body, r.header, "whsec_other")).toThrow();
  });
});
