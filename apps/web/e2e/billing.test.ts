import { expect, it } from "vitest";
import { useBrowser } from "./support/browser";

const session = useBrowser();

it("an admin fills the free seats, buys more on the fake checkout page, and invites one more member", async () => {
  const stamp = Date.now().toString(36);
  const { page } = await session.newPage();
  await page.goto("/sign-up");
  await page.getByLabel("Your name").fill("Odile Fenwick");
  await page.getByLabel("E-mail address", { exact: true }).fill(`payer-${stamp}@example.test`);
  await page.getByLabel("Password").fill("a long enough passphrase");
  await page.getByLabel("Organization name").fill(`Marrowby Clerks ${stamp}`);
  await page.getByRole("button", { name: "Create account" }).click();
  await page.waitForURL(/\/o\/[0-9a-f-]+$/);

  // The free plan's 5 seats: the founder and four invitations; the fifth invitation is refused.
  await page.getByRole("navigation", { name: "Areas" }).getByRole("link", { name: "Members" }).click();
  const invite = async (n: number) => {
    await page.getByLabel("E-mail address", { exact: true }).fill(`seat-${n}-${stamp}@example.test`);
    await page.getByRole("button", { name: "Send invitation" }).click();
  };
  for (let n = 1; n <= 4; n++) {
    await invite(n);
    await page.getByRole("cell", { name: `seat-${n}-${stamp}@example.test` }).waitFor();
  }
  await invite(5);
  await page.getByText(/All 5 seats are in use/).waitFor();
  await page.getByRole("link", { name: "Add seats on the Billing page" }).click();

  await page.getByRole("heading", { name: "Buy seats" }).waitFor();
  await page.getByLabel("Seats").fill("6");
  await page.getByRole("button", { name: "Continue to payment" }).click();
  await page.waitForURL(/\/pay\/cs_test_/);
  await page.getByText("LOCAL TEST PAYMENT PAGE").waitFor();
  await page.getByRole("button", { name: /^Pay .* \(test\)$/ }).click();

  // Back on the Billing page; the seats change when the signed webhook has been handled.
  await page.waitForURL(/\/billing\?checkout=returned$/);
  await page.getByText("5 used of 6 paid").waitFor({ timeout: 20_000 });
  expect(await page.getByRole("table", { name: "Invoices" }).getByRole("row").count()).toBe(2);

  await page.getByRole("navigation", { name: "Areas" }).getByRole("link", { name: "Members" }).click();
  await invite(5);
  await page.getByRole("cell", { name: `seat-5-${stamp}@example.test` }).waitFor();
  expect((page as typeof page & { outsideRequests?: string[] }).outsideRequests).toEqual([]);
});
