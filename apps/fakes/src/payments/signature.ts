import { createHmac } from "node:crypto";

/**
 * The webhook signature header the payments provider sends: `t=<unix seconds>,v1=<hex>` where
 * v1 is HMAC-SHA256 over `${t}.${payload}` keyed with the endpoint's signing secret. Written from
 * the provider's published scheme (common practice, "Verify webhook signatures manually"); the
 * tests check it with the official SDK's `webhooks.constructEvent`, not with this code.
 */
export function signPayload(payload: string, secret: string, timestamp = Math.floor(Date.now() / 1000)): string {
  const v1 = createHmac("sha256", secret).update(`${timestamp}.${payload}`, "utf8").digest("hex");
  return `t=${timestamp},v1=${v1}`;
}
