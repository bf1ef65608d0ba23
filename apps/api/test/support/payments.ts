import type { PaymentsFake } from "@tagloom/fakes";
import type { TestServer } from "./http";

/** The payments fake of this test file (started by per-file-setup.ts), sending webhooks to `server`. */
export function testPayments(server?: TestServer): PaymentsFake {
  const fake = (globalThis as { __tagloomPayments?: PaymentsFake }).__tagloomPayments;
  if (!fake) throw new Error("payments fake not started");
  if (server) fake.setWebhookUrl(`${server.url}/api/billing/webhook`);
  return fake;
}
