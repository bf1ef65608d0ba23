import { type Browser, type Page, chromium } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { type Product, startProduct } from "./support/product";

// The whole demo, as a new user meets it after `npm start`: each role signs in to the seeded
// demo organization and does its main job there through the UI alone; the API token the seed
// printed tags a text. Each wait is bounded (playwright's timeouts below), so a step that hangs
// fails instead of stalling the run.
const PASSWORD = "demo-password-1";
// 40 s: the review and the comparison are computed in the API request (the comparison trains
// nothing but scores two taggers and bootstraps); on a machine whose two cores are busy with
// other work they took over 20 s in one full run, while 4 s alone.
const STEP_MS = 40_000;

let product: Product;
let browser: Browser;
const problems: string[] = [];

beforeAll(async () => {
  product = await startProduct({ demo: true });
  browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
    headless: true,
    args: ["--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync", "--disable-dev-shm-usage"],
  });
}, 600_000);

afterAll(async () => {
  await browser?.close();
  await product?.stop();
});

/** A fresh browser context signed in as a demo user; console errors and failed requests are recorded. */
async function signInAs(email: string): Promise<{ page: Page; orgId: string; close: () => Promise<void> }> {
  const context = await browser.newContext({ baseURL: product.baseUrl, viewport: { width: 1440, height: 900 } });
  context.setDefaultTimeout(STEP_MS);
  await context.route(/^https?:\/\/(?!127\.0\.0\.1)/, (route) => {
    problems.push(`${email}: request to another host ${route.request().url()}`);
    return route.abort();
  });
  const page = await context.newPage();
  page.on("console", (m) => {
    if (m.type() === "error") problems.push(`${email}: console error: ${m.text()} (${m.location().url})`);
  });
  page.on("pageerror", (err) => problems.push(`${email}: page error: ${err.message}`));
  page.on("requestfailed", (r) => {
    // A request the browser dropped because the test navigated on or closed the page is no failure.
    if (r.failure()?.errorText === "net::ERR_ABORTED") return;
    problems.push(`${email}: request failed: ${r.method()} ${r.url()} ${r.failure()?.errorText ?? ""}`);
  });
  page.on("response", (r) => {
    if (r.status() >= 500) problems.push(`${email}: ${r.status()} from ${r.request().method()} ${r.url()}`);
  });
  await page.goto("/sign-in");
  await page.getByLabel("E-mail address").fill(email);
  await page.getByLabel("Password").fill(PASSWORD);
  await page.getByRole("button", { name: /sign in/i }).click();
  await page.waitForURL(/\/o\/[0-9a-f-]{36}/);
  const orgId = /\/o\/([0-9a-f-]{36})/.exec(page.url())![1]!;
  return { page, orgId, close: () => context.close() };
}

describe("the demo, role by role", () => {
  it("the admin finds the demo's e-mails in the Outbox, adds a seat on the payments fake and invites one more member", async () => {
    const { page, orgId, close } = await signInAs("admin@demo.tagloom.test");
    // The seed's invitation and the batches' assignment notices went through SMTP to the catcher.
    await page.goto("/dev/outbox");
    await page.getByText(/You are invited to Quenmarrow Contract Desk/).first().waitFor();
    await page.getByText(/fennick\.orlavie@demo\.tagloom\.test/).first().waitFor();
    await page.getByText(/annotator3@demo\.tagloom\.test/).first().waitFor();
    // Seven members and the pending invitation fill the eight paid seats.
    await page.goto(`/o/${orgId}/billing`);
    await page.getByText("8 used of 8 paid").waitFor();
    await page.getByLabel("Seats").fill("9");
    await page.getByRole("button", { name: "Save seats" }).click();
    await page.getByText("8 used of 9 paid").waitFor();
    await page.goto(`/o/${orgId}/members`);
    await page.getByText("Brannic Tuvel").first().waitFor();
    await page.getByLabel("E-mail address").fill("newcomer@demo.tagloom.test");
    await page.getByRole("button", { name: "Send invitation" }).click();
    await page.getByText("newcomer@demo.tagloom.test").first().waitFor();
    await page.goto(`/o/${orgId}/billing`);
    await page.getByText("9 used of 9 paid").waitFor();
    await close();
  });

  it("the manager settles a disagreement of the batch under review and accepts the document as gold", async () => {
    const { page, orgId, close } = await signInAs("manager@demo.tagloom.test");
    await page.goto(`/o/${orgId}/batches`);
    await page.getByRole("link", { name: "Second look: spring orders" }).first().click();
    const documents = page.getByRole("table", { name: "Documents of the batch" });
    // Four of its documents were settled into gold by the seed.
    await documents.getByText("Gold", { exact: true }).first().waitFor();
    const goldBefore = await documents.getByText("Gold", { exact: true }).count();
    expect(goldBefore).toBe(4);
    await documents.getByRole("link", { name: /Review/ }).first().click();
    await page.getByRole("heading", { name: /^Disagreements \(\d+\)$/ }).waitFor();
    // Each disagreement: take the first annotator's version.
    const items = page.getByRole("listitem").filter({ has: page.getByRole("radio") });
    // count() does not wait: the heading can paint a moment before the disagreements' choices.
    await items.first().waitFor();
    const n = await items.count();
    expect(n).toBeGreaterThan(0);
    for (let i = 0; i < n; i++) await items.nth(i).getByRole("radio").first().check();
    await page.getByRole("button", { name: /Accept the settled result as gold/ }).click();
    await expect.poll(() => documents.getByText("Gold", { exact: true }).count(), { timeout: STEP_MS }).toBe(goldBefore + 1);
    await close();
  });

  it("the data lead compares the two demo taggers on the same test documents", async () => {
    const { page, orgId, close } = await signInAs("lead@demo.tagloom.test");
    await page.goto(`/o/${orgId}/corpora`);
    await page.getByRole("link", { name: "Supply agreements" }).first().click();
    await page.getByRole("link", { name: "Training" }).click();
    await page.getByText("suggester", { exact: true }).waitFor();
    await page.getByRole("link", { name: "Tagger v2 of Supply agreements" }).click();
    await page.getByLabel("Compare with").selectOption({ index: 0 });
    await page.getByRole("button", { name: "Compare", exact: true }).click();
    await page.getByText(/^F1 difference \(B − A\)/).waitFor();
    await close();
  });

  it("an annotator opens the next document and accepts a suggestion", async () => {
    const { page, orgId, close } = await signInAs("annotator3@demo.tagloom.test");
    await page.goto(`/o/${orgId}/queue`);
    await page.getByRole("heading", { name: "My queue" }).waitFor();
    await page.getByRole("link", { name: /^Start next: / }).click();
    const panel = page.locator("section", { has: page.locator("#suggestions-title") });
    const count = async () => Number(/\((\d+) to decide\)/.exec((await panel.locator("#suggestions-title").textContent()) ?? "")?.[1] ?? NaN);
    await expect.poll(count, { timeout: STEP_MS }).toBeGreaterThan(0);
    const before = await count();
    await panel.getByRole("button", { name: "Accept", exact: true }).first().click();
    await expect.poll(count, { timeout: STEP_MS }).toBe(before - 1);
    await page.getByText(/^Saved /).waitFor();
    await close();
  });

  it("the demo API token tags a text with the suggester", async () => {
    expect(product.demoToken).toMatch(/^tgl_/);
    const res = await fetch(`${product.baseUrl}/api/v1/corpora/${product.demoCorpusId}/tag`, {
      method: "POST",
      headers: { Authorization: `Bearer ${product.demoToken}`, "Content-Type": "application/json" },
      body: JSON.stringify({ text: "Orvel Castrane of Brindlewick Freight signed the order for Sallowmere." }),
    });
    expect(res.status).toBe(200);
    const body = (await res.json()) as { tagger: { version: number }; results: { spans: { text: string; type: string }[] }[] };
    expect(body.tagger.version).toBe(1);
    expect(body.results[0]!.spans.map((s) => s.text)).toContain("Brindlewick Freight");
  });

  it("no step logged a console error or had a request fail", () => {
    expect(problems).toEqual([]);
  });
});
