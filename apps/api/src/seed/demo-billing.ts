import { type Actor } from "@/audit/audit.service";
import { getBillingState, startCheckout } from "@/billing/billing.service";
import { waitFor } from "./demo-wait";

/** Seats the demo buys: its seven members and room for one more invitation. */
export const DEMO_SEATS = 8;

/**
 * Buys the demo's seats the way an admin does: a checkout started by the billing service, paid on
 * the payments fake's hosted test page, and the fake's signed webhooks received by the running
 * API, which raise the seats and store the paid invoice.
 */
export async function seedBilling(organizationId: string, admin: Actor & { userId: string }): Promise<void> {
  const { url } = await startCheckout(organizationId, DEMO_SEATS, admin);
  let res: Response;
  try {
    res = await fetch(url, { method: "POST", redirect: "manual" });
  } catch (err) {
    throw new Error(`demo data: the payments fake did not answer at ${url} (${(err as Error).message}); npm start runs it before loading the demo`);
  }
  if (res.status !== 303) throw new Error(`demo data: paying the demo checkout on the payments fake answered ${res.status}`);
  await waitFor(
    "the payments webhooks (the API must be running to receive them)",
    async () => {
      const s = await getBillingState(organizationId);
      return s.plan === "per_seat" && s.invoices.some((i) => i.status === "paid") ? s : null;
    },
    60_000,
    300,
  );
}
