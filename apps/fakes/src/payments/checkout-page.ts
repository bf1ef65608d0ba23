/** HTML of the fake's hosted checkout page: plainly a local test page, no card fields. */
export type CheckoutPageView = {
  sessionId: string;
  seats: number;
  unitAmount: number;
  currency: string;
  status: "open" | "complete" | "expired";
  declined: boolean;
  cancelUrl: string | null;
};

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);

export function money(amount: number, currency: string): string {
  return `${(amount / 100).toFixed(2)} ${currency.toUpperCase()}`;
}

export function renderCheckoutPage(v: CheckoutPageView): string {
  const total = money(v.unitAmount * v.seats, v.currency);
  const body =
    v.status === "open"
      ? `<p class="sum">${v.seats} seat${v.seats === 1 ? "" : "s"} × ${esc(money(v.unitAmount, v.currency))} a month = <strong>${esc(total)}</strong> a month</p>
    ${v.declined ? `<p class="declined" role="alert">The test payment was declined (the fake was told to fail payments). Nothing was charged.</p>` : ""}
    <form method="post" action="/pay/${esc(v.sessionId)}"><button type="submit">Pay ${esc(total)} (test)</button></form>
    ${v.cancelUrl ? `<p><a href="${esc(v.cancelUrl)}">Go back without paying</a></p>` : ""}`
      : `<p class="sum">This checkout is ${v.status === "complete" ? "already paid" : "no longer open"}.</p>`;
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>Local test payment page</title>
<style>
  body { font: 16px/1.5 system-ui, sans-serif; margin: 0; background: #f3f1ea; color: #1f2328; }
  .banner { background: #7a2e0e; color: #fff; padding: 12px 20px; font-weight: 600; }
  main { max-width: 30rem; width: calc(100% - 32px); box-sizing: border-box; margin: 40px auto; background: #fff; border: 1px solid #d6d2c4; border-radius: 10px; padding: 24px 28px; }
  h1 { font-size: 1.3rem; margin: 0 0 8px; }
  .sum { margin: 16px 0; }
  .declined { background: #fde8e4; border: 1px solid #e2a195; padding: 10px 12px; border-radius: 6px; }
  button { font: inherit; font-weight: 600; background: #24534a; color: #fff; border: 0; border-radius: 6px; padding: 10px 18px; cursor: pointer; width: 100%; }
  small { color: #59606a; }
</style></head>
<body>
<div class="banner" role="note">LOCAL TEST PAYMENT PAGE — served by Tagloom's payments fake. No card is asked for and no money moves.</div>
<main>
  <h1>Tagloom seats (test checkout)</h1>
  <small>Checkout ${esc(v.sessionId)}</small>
  ${body}
</main>
</body></html>`;
}
