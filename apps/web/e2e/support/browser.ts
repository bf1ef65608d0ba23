import { type Browser, type BrowserContext, type Page, chromium } from "playwright-core";
import { afterAll, beforeAll, inject } from "vitest";

// Debian's Chromium, without the background services that would call outside hosts.
const ARGS = [
  "--no-sandbox",
  "--disable-gpu",
  "--disable-quic",
  "--no-first-run",
  "--disable-background-networking",
  "--disable-component-update",
  "--disable-sync",
  "--disable-dev-shm-usage",
];

export type BrowserSession = {
  baseUrl: string;
  mailUrl: string;
  /** A new isolated browser context (its own cookies) with a page open; `baseUrl` for a private product. */
  newPage(options?: { baseUrl?: string; viewport?: { width: number; height: number } }): Promise<{ context: BrowserContext; page: Page }>;
};

/** Launches Chromium for this test file and closes it afterwards. Fails the page on errors. */
export function useBrowser(): BrowserSession {
  let browser: Browser | null = null;
  const contexts: BrowserContext[] = [];
  beforeAll(async () => {
    browser = await chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium", headless: true, args: ARGS });
  });
  afterAll(async () => {
    for (const c of contexts) await c.close().catch(() => undefined);
    await browser?.close();
  });
  const baseUrl = inject("baseUrl");
  return {
    baseUrl,
    mailUrl: inject("mailUrl"),
    async newPage(options = {}) {
      if (!browser) throw new Error("browser not started");
      const context = await browser.newContext({ baseURL: options.baseUrl ?? baseUrl, viewport: options.viewport ?? { width: 1280, height: 860 } });
      contexts.push(context);
      const page = await context.newPage();
      // Any request to another host would be a leak (fonts, scripts): refuse and record it.
      const outside: string[] = [];
      await context.route(/^https?:\/\/(?!127\.0\.0\.1)/, (route) => {
        outside.push(route.request().url());
        return route.abort();
      });
      (page as Page & { outsideRequests?: string[] }).outsideRequests = outside;
      return { context, page };
    },
  };
}

/** The latest e-mail to an address whose subject matches, read from the mail catcher. */
export async function waitForEmail(mailUrl: string, to: string, subject: RegExp, timeoutMs = 20_000): Promise<{ subject: string; text: string; link: string }> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const res = await fetch(`${mailUrl}/messages`);
    const { items } = (await res.json()) as { items: { to: string[]; subject: string; text: string }[] };
    const m = items.find((x) => x.to.includes(to) && subject.test(x.subject));
    if (m) return { subject: m.subject, text: m.text, link: /https?:\/\/\S+/.exec(m.text)?.[0] ?? "" };
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`no e-mail to ${to} matching ${subject} within ${timeoutMs} ms`);
}
