import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import Stripe from "stripe";
import { afterAll, describe, expect, it } from "vitest";
import { type PaymentsFake, startPaymentsFake } from "./payments-fake";

// A restarted fake (a second `npm start`) must still know the subscriptions and invoices it sold,
// or every seat change of the demo would fail. The official SDK makes every request.
const dir = fs.mkdtempSync(path.join(os.tmpdir(), "payments-fake-state-"));
const stateFile = path.join(dir, "nested", "payments-fake.json");
const running: PaymentsFake[] = [];

afterAll(async () => {
  for (const f of running) await f.stop();
  fs.rmSync(dir, { recursive: true, force: true });
});

async function start(port?: number): Promise<{ fake: PaymentsFake; sdk: Stripe }> {
  const fake = await startPaymentsFake({ port, stateFile, webhookUrl: null });
  running.push(fake);
  return { fake, sdk: new Stripe("sk_test_tagloom_local", { host: "127.0.0.1", port: fake.port, protocol: "http", maxNetworkRetries: 0, telemetry: false }) };
}

describe("payments fake with a state file", () => {
  it("keeps customers, subscriptions and invoices across a restart, and a seat change still works", async () => {
    const first = await start();
    const customer = await first.sdk.customers.create({ name: "Vesk Pottery", metadata: { organizationId: "org-9" } });
    const session = await first.sdk.checkout.sessions.create({
      mode: "subscription",
      customer: customer.id,
      line_items: [{ price: "price_tagloom_seat", quantity: 8 }],
      success_url: "http://127.0.0.1:1/done",
      subscription_data: { metadata: { organizationId: "org-9" } },
    });
    const paid = await fetch(session.url!, { method: "POST", redirect: "manual" });
    expect(paid.status).toBe(303);
    const subId = String((await first.sdk.checkout.sessions.retrieve(session.id)).subscription);
    // Written atomically: no temporary file is left beside it.
    expect(fs.readdirSync(path.dirname(stateFile))).toEqual(["payments-fake.json"]);
    const port = first.fake.port;
    await first.fake.stop();
    running.pop();

    const second = await start(port);
    const sub = await second.sdk.subscriptions.retrieve(subId);
    expect(sub.status).toBe("active");
    expect(sub.metadata.organizationId).toBe("org-9");
    expect(sub.items.data[0]!.quantity).toBe(8);
    expect((await second.sdk.customers.retrieve(customer.id)).id).toBe(customer.id);
    const invoices = await second.sdk.invoices.list({ customer: customer.id });
    expect(invoices.data.map((i) => [i.status, i.amount_paid, i.number])).toEqual([["paid", 8 * 900, "TEST-0001"]]);

    const updated = await second.sdk.subscriptions.update(subId, { items: [{ id: sub.items.data[0]!.id, quantity: 9 }], proration_behavior: "always_invoice" });
    expect(updated.items.data[0]!.quantity).toBe(9);
    const after = await second.sdk.invoices.list({ customer: customer.id });
    // Invoice numbers go on from the saved counter rather than starting over.
    expect(after.data.map((i) => [i.status, i.amount_paid, i.number])).toEqual([
      ["paid", 900, "TEST-0002"],
      ["paid", 8 * 900, "TEST-0001"],
    ]);
    await second.fake.stop();
    running.pop();

    const third = await start();
    expect((await third.sdk.subscriptions.retrieve(subId)).items.data[0]!.quantity).toBe(9);
  });

  it("without a state file a restarted fake starts empty", async () => {
    const fake = await startPaymentsFake({ webhookUrl: null });
    running.push(fake);
    const sdk = new Stripe("sk_test_tagloom_local", { host: "127.0.0.1", port: fake.port, protocol: "http", maxNetworkRetries: 0, telemetry: false });
    const customer = await sdk.customers.create({ name: "Tarnel Looms" });
    await fake.stop();
    running.pop();
    const again = await startPaymentsFake({ port: fake.port, webhookUrl: null });
    running.push(again);
    await expect(sdk.customers.retrieve(customer.id)).rejects.toMatchObject({ statusCode: 404 });
  });
});
