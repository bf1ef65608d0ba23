import { describe, expect, it } from "vitest";
import { useBrowser } from "./support/browser";

const session = useBrowser();

describe("accounts in the browser", () => {
  it("signs up, invites a colleague, who opens the e-mail in the Outbox, accepts in another browser, and is listed", async () => {
    const stamp = Date.now().toString(36);
    const founderEmail = `founder-${stamp}@example.test`;
    const colleagueEmail = `colleague-${stamp}@example.test`;

    // The founder signs up and lands in the new organization.
    const { page } = await session.newPage();
    await page.goto("/sign-up");
    await page.getByLabel("Your name").fill("Wren Adair");
    await page.getByLabel("E-mail address", { exact: true }).fill(founderEmail);
    await page.getByLabel("Password").fill("a long enough passphrase");
    await page.getByLabel("Organization name").fill(`Thistle Survey ${stamp}`);
    await page.getByRole("button", { name: "Create account" }).click();
    await page.waitForURL(/\/o\/[0-9a-f-]+$/);
    await page.getByRole("heading", { name: `Thistle Survey ${stamp}` }).waitFor();

    // A form error is shown inline and nothing is sent.
    await page.getByRole("navigation", { name: "Areas" }).getByRole("link", { name: "Members" }).click();
    await page.getByLabel("E-mail address", { exact: true }).fill("not an address");
    await page.getByRole("button", { name: "Send invitation" }).click();
    await page.getByText("Enter a valid e-mail address.").waitFor();

    await page.getByLabel("E-mail address", { exact: true }).fill(colleagueEmail);
    await page.getByLabel("Role", { exact: true }).selectOption("manager");
    await page.getByRole("button", { name: "Send invitation" }).click();
    await page.getByRole("cell", { name: colleagueEmail }).waitFor();

    // The colleague, in a second browser context, reads the invitation in the Outbox page.
    const other = await session.newPage();
    const p2 = other.page;
    await p2.goto("/dev/outbox");
    const subject = p2.getByRole("button", { name: new RegExp(`invited to Thistle Survey ${stamp}`) });
    await subject.waitFor({ timeout: 20_000 });
    await subject.click();
    const link = p2.getByRole("article", { name: "Message" }).getByRole("link", { name: /\/invitations\// });
    const href = (await link.getAttribute("href"))!;
    expect(href).toContain(session.baseUrl);
    await p2.goto(href);
    await p2.getByRole("heading", { name: `Join Thistle Survey ${stamp}` }).waitFor();
    await p2.getByLabel("Your name").fill("Sol Brannock");
    await p2.getByLabel("Password").fill("another long passphrase");
    await p2.getByRole("button", { name: /Create account and join/ }).click();
    await p2.waitForURL(/\/o\/[0-9a-f-]+$/);
    await p2.getByText("You are manager here.").waitFor();

    // Back in the founder's browser, the colleague is listed as a manager.
    await page.reload();
    const row = page.getByRole("table", { name: "Members" }).getByRole("row", { name: new RegExp(colleagueEmail) });
    await row.waitFor();
    expect(await row.getByRole("combobox").inputValue()).toBe("manager");
    // Both can sign in again.
    await p2.getByRole("button", { name: "Sign out" }).click();
    await p2.waitForURL(/\/sign-in$/);
    await p2.getByLabel("E-mail address").fill(colleagueEmail);
    await p2.getByLabel("Password").fill("another long passphrase");
    await p2.getByRole("button", { name: "Sign in" }).click();
    await p2.waitForURL(/\/o\/[0-9a-f-]+$/);
  });
});
