import fs from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import type { Locator, Page } from "playwright-core";
import { afterAll, beforeAll, expect, it } from "vitest";
import { useBrowser } from "./support/browser";
import { type Product, startProduct } from "./support/product";

// The payments service is down as an admin sees it: a private product (the shared one's payments
// fake must stay up for the other browser tests) whose payments fake is stopped after the Billing
// page has loaded. "Continue to payment" must say plainly what happened, and nothing may change.
const session = useBrowser();
let product: Product;
// Screenshots are test artifacts (test-results/ is ignored by git).
const shots = path.join(path.dirname(fileURLToPath(import.meta.url)), "..", "test-results", "billing-payments-down");

/** Whether two elements' boxes on the screen share any area. */
async function overlap(a: Locator, b: Locator): Promise<boolean> {
  const [p, q] = [await a.boundingBox(), await b.boundingBox()];
  if (!p || !q) throw new Error("element not on screen");
  return p.x < q.x + q.width && q.x < p.x + p.width && p.y < q.y + q.height && q.y < p.y + p.height;
}

/** The toasts on screen now (the region holds the ones not yet gone). */
const toasts = (page: Page) => page.getByTestId("toast-region").getByRole("alert");

beforeAll(async () => {
  product = await startProduct();
}, 180_000);
afterAll(async () => {
  await product?.stop();
});

it("Continue to payment with the payments service down shows a clear error and changes neither seats nor plan", async () => {
  const stamp = Date.now().toString(36);
  const { page } = await session.newPage({ baseUrl: product.baseUrl });
  await page.goto("/sign-up");
  await page.getByLabel("Your name").fill("Wren Alderby");
  await page.getByLabel("E-mail address", { exact: true }).fill(`down-${stamp}@example.test`);
  await page.getByLabel("Password").fill("a long enough passphrase");
  await page.getByLabel("Organization name").fill(`Gorsefield Ledgers ${stamp}`);
  await page.getByRole("button", { name: "Create account" }).click();
  await page.waitForURL(/\/o\/[0-9a-f-]+$/);
  const orgId = /\/o\/([0-9a-f-]+)$/.exec(page.url())![1]!;

  await page.getByRole("navigation", { name: "Areas" }).getByRole("link", { name: "Billing" }).click();
  await page.getByRole("heading", { name: "Buy seats" }).waitFor();
  await page.getByText("1 used of 5 free").waitFor();
  const before = await (await page.request.get(`/api/orgs/${orgId}/billing`)).json();
  expect(before).toMatchObject({ plan: "free", seatLimit: 5, seatsUsed: 1, subscription: null, checkoutPending: false });

  await product.stopPayments();
  await page.getByLabel("Seats").fill("7");
  const answered = page.waitForResponse((r) => r.url().endsWith(`/api/orgs/${orgId}/billing/checkout`));
  await page.getByRole("button", { name: "Continue to payment" }).click();
  expect((await answered).status()).toBe(503);

  const form = page.locator("form", { has: page.getByRole("button", { name: "Continue to payment" }) }).locator("..");
  const alert = form.getByRole("alert");
  await alert.waitFor();
  expect(await alert.innerText()).toMatch(/^The payments service cannot be reached right now\. Nothing was changed; try again in a minute\./);
  // Not a raw code or status, and not blamed on the seat count the admin typed.
  const text = await page.locator("main").innerText();
  expect(text).not.toMatch(/payments_unavailable|503|service_unavailable|internal/);
  expect(await page.getByLabel("Seats").getAttribute("aria-invalid")).toBe("false");
  expect(await page.getByLabel("Seats").inputValue()).toBe("7");
  expect(page.url()).toMatch(new RegExp(`/o/${orgId}/billing$`));

  // Nothing changed: the page (refetched after the attempt) and the API say the same as before.
  await page.getByText("1 used of 5 free").waitFor();
  const after = await (await page.request.get(`/api/orgs/${orgId}/billing`)).json();
  expect(after).toEqual(before);
  // The outage is said once, in the form's notice: the global toast skips an error the form shows
  // (the answer came before the refetch the page waited for, and the toast would follow at once).
  expect(await toasts(page).count()).toBe(0);
  expect(await page.getByText("The payments service cannot be reached right now.", { exact: false }).count()).toBe(1);

  // On a phone an outage toast that does come (the e-mail banner's "Send it again" shows no error
  // of its own) sits in the header's band, clear of the form and its notice.
  fs.mkdirSync(shots, { recursive: true });
  await page.setViewportSize({ width: 1440, height: 900 });
  await page.screenshot({ path: path.join(shots, "notice-1440.png"), fullPage: true });
  await page.setViewportSize({ width: 390, height: 844 });
  await page.getByRole("button", { name: "Send it again" }).waitFor();
  await page.route("**/api/auth/verify-email/resend", (route) => route.abort("connectionrefused"));
  await page.getByRole("button", { name: "Send it again" }).click();
  const toast = toasts(page);
  await toast.waitFor();
  expect(await toast.innerText()).toBe("Cannot reach the server. Check your connection and try again.");
  const card = page.locator("form", { has: page.getByRole("button", { name: "Continue to payment" }) }).locator("..");
  expect(await overlap(toast, card)).toBe(false);
  expect(await overlap(toast, alert)).toBe(false);
  // Scrolled or not, it stays inside the sticky header's band, so it never covers the page below.
  for (const y of [0, 400]) {
    await page.evaluate((top) => window.scrollTo(0, top), y);
    const header = await page.locator("header").boundingBox();
    const box = await toast.boundingBox();
    expect(box!.y).toBeGreaterThanOrEqual(header!.y);
    expect(box!.y + box!.height).toBeLessThanOrEqual(header!.y + header!.height);
  }
  await page.evaluate(() => window.scrollTo(0, 0));
  await page.screenshot({ path: path.join(shots, "toast-390.png") });
  // A tap opens it in full (a longer message is cut to two lines on phones) and keeps it.
  await toast.getByRole("button").click();
  await toast.getByRole("button", { expanded: true }).waitFor();
  await page.screenshot({ path: path.join(shots, "toast-390-open.png") });
  await page.setViewportSize({ width: 1440, height: 900 });
  await page.screenshot({ path: path.join(shots, "toast-1440.png") });

  expect((page as typeof page & { outsideRequests?: string[] }).outsideRequests).toEqual([]);
}, 120_000);
