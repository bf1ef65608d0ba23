import { describe, expect, it } from "vitest";
import { useBrowser } from "./support/browser";

const session = useBrowser();

describe("the built app in Chromium", () => {
  it("serves the shell and the sign-in screen from the API's own URL, with fonts from the same host", async () => {
    const { page } = await session.newPage();
    const errors: string[] = [];
    page.on("pageerror", (e) => errors.push(e.message));
    await page.goto("/");
    await page.waitForURL(/\/sign-in$/);
    // isVisible() does not wait: the URL can change a moment before the screen paints.
    await page.getByRole("heading", { name: "Sign in" }).waitFor();
    await page.getByText("Tagloom").first().waitFor();
    const fontOk = await page.evaluate(async () => {
      await document.fonts.ready;
      return document.fonts.check('16px "Inter Variable"');
    });
    expect(fontOk).toBe(true);
    expect((page as unknown as { outsideRequests: string[] }).outsideRequests).toEqual([]);
    expect(errors).toEqual([]);
    const health = await page.request.get("/api/health");
    expect(await health.json()).toEqual({ ok: true, db: "up" });
  });

  it("shows a not-found page for an unknown address", async () => {
    const { page } = await session.newPage();
    await page.goto("/no/such/page");
    await page.getByRole("heading", { name: "Nothing here" }).waitFor();
  });
});
