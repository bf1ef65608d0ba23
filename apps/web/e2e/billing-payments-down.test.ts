import { afterAll, beforeAll, expect, it } from "vitest";
import { useBrowser } from "./support/browser";
import { type Product, startProduct } from "./support/product";

// The payments service is down as an admin sees it: a private product (the shared one's payments
// fake must stay up for the other browser tests) whose payments fake is stopped after the Billing
// page has loaded. "Continue to payment" must say plainly what happened, and nothing may change.
const session = useBrowser();
let product: Product;

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

  expect((page as typeof page & { outsideRequests?: string[] }).outsideRequests).toEqual([]);
}, 120_000);
