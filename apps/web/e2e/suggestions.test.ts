import fs from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import type { Page } from "playwright-core";
import { beforeAll, describe, expect, it } from "vitest";
import { signIn, waitSaved } from "./support/annotation-team";
import { useBrowser } from "./support/browser";
import { type SuggestTeam, setUpSuggestTeam } from "./support/suggest-team";

const session = useBrowser();
let team: SuggestTeam;
// Screenshots are test artifacts (test-results/ is ignored by git).
const shots = path.join(path.dirname(fileURLToPath(import.meta.url)), "..", "test-results", "suggestions");

beforeAll(async () => {
  team = await setUpSuggestTeam(session.baseUrl, session.mailUrl, `s${Date.now().toString(36)}`);
}, 120_000);

/** The spans drawn in the workspace, as "TYPE:text". */
async function marks(page: Page): Promise<string[]> {
  return page.locator("[data-testid=document-text] mark[data-span]").evaluateAll((els) =>
    els.map((el) => `${el.getAttribute("data-type")}:${[...el.querySelectorAll("[data-t]")].map((t) => t.textContent).join(" ")}`),
  );
}

describe("suggestions in the browser", () => {
  it("a data lead sets the suggester; an annotator accepts two suggestions and rejects one; the data lead sees the precision", async () => {
    const base = `/o/${team.orgId}/corpora/${team.corpusId}`;
    const { page: lead } = await session.newPage();
    const errors: string[] = [];
    lead.on("pageerror", (e) => errors.push(e.message));
    await signIn(lead, team.lead, `${base}/suggester`);
    await lead.getByText("No tagger suggests for this corpus yet.").waitFor();
    // The only tagger is the first choice after "None".
    await lead.getByLabel("Tagger that suggests").selectOption({ index: 1 });
    await lead.getByRole("button", { name: "Use this suggester" }).click();
    await lead.getByTestId("suggester-current").getByText(/\(version 1\) pre-annotates documents without gold/).waitFor();
    // Every document without gold: the two of the team set-up and the 12 open reports.
    await lead.getByText(/^Tagged 14 of 14 documents/).waitFor({ timeout: 30_000 });
    await lead.getByText("As annotators judged it: 0 accepted, 0 rejected — no decisions yet.").waitFor();

    const docTitle = "Open report 1";
    const [ines] = team.annotators;
    await team.api.call("POST", `/orgs/${team.orgId}/corpora/${team.corpusId}/batches`, {
      name: "Suggested first",
      documentIds: [team.open[docTitle]],
      assignment: { mode: "round_robin", annotatorIds: [ines.userId], annotatorsPerDocument: 1 },
    });
    const { page } = await session.newPage();
    page.on("pageerror", (e) => errors.push(e.message));
    await signIn(page, ines, `/o/${team.orgId}/queue`);
    await page.getByRole("link", { name: docTitle, exact: true }).click();
    await page.getByTestId("document-text").waitFor();

    // The tagger's suggestions: drawn apart in the text with a percentage, listed with their confidence.
    const panel = page.getByRole("region", { name: /Suggestions/ });
    const items = panel.getByRole("listitem");
    await items.first().waitFor();
    const before = await items.count();
    expect(before).toBeGreaterThanOrEqual(3);
    for (const text of await items.allTextContents()) expect(text).toMatch(/(PERSON|PLACE|ORG) · \d{1,3}%/);
    expect(await page.locator("[data-testid=document-text] [data-suggestion] .tl-span-pct").count()).toBe(before);
    expect(await marks(page)).toEqual([]);

    // Accept the first two and reject the next one (a decided suggestion leaves the list).
    const label = async () => (await items.first().getByRole("button").first().textContent())!.replace(/\s+\S+ · \d+%$/, "");
    const accepted: string[] = [];
    for (let i = 0; i < 2; i++) {
      accepted.push(await label());
      await items.first().getByRole("button", { name: "Accept", exact: true }).click();
    }
    const rejected = await label();
    await items.first().getByRole("button", { name: "Reject", exact: true }).click();
    await panel.getByText(`(${before - 3} to decide)`).waitFor();
    expect((await marks(page)).map((m) => m.split(":")[1])).toEqual(accepted);
    expect(await items.allTextContents()).not.toContainEqual(expect.stringContaining(rejected));
    await waitSaved(page);

    // The data lead sees the suggester judged by the annotator: 2 of 3 accepted.
    await lead.reload();
    await lead.getByTestId("suggester-precision").getByText("As annotators judged it: 2 accepted, 1 rejected — precision 67%.").waitFor();
    expect(errors).toEqual([]);
  });

  it("a manager selects the 5 most uncertain documents and lands in the batch form with them", async () => {
    const { page } = await session.newPage();
    const errors: string[] = [];
    page.on("pageerror", (e) => errors.push(e.message));
    await signIn(page, team.boss, `/o/${team.orgId}/corpora/${team.corpusId}`);
    await page.getByRole("navigation", { name: "Corpus" }).getByRole("link", { name: "Most uncertain" }).click();
    await page.getByText(/mean token entropy/).first().waitFor();
    // The screen says what the ranking is measured to buy, not only what it ranks by.
    await page.getByTestId("uncertain-evidence").getByText(/random picks for the same number of words labelled/).waitFor();
    const rows = page.getByRole("table", { name: "Most uncertain documents" }).locator("tbody tr");
    await rows.first().waitFor();
    expect(await rows.count()).toBe(14);
    // The manager's reason is on every row.
    for (const text of await rows.allTextContents()) expect(text).toMatch(/low-confidence spans: \d+ of \d+|no entities suggested/);

    // At 1440 px the reason has a column of its own; at 390 px it sits under the document name,
    // and the table fits the screen without sideways scrolling.
    fs.mkdirSync(shots, { recursive: true });
    const region = page.getByRole("region", { name: "Most uncertain documents" });
    const headers = () => page.getByRole("table", { name: "Most uncertain documents" }).getByRole("columnheader").allTextContents();
    await page.setViewportSize({ width: 1440, height: 900 });
    expect(await headers()).toContain("Why");
    await page.screenshot({ path: path.join(shots, "uncertain-1440.png"), fullPage: true });
    await page.setViewportSize({ width: 390, height: 844 });
    await page.waitForFunction(() => ![...document.querySelectorAll("th")].some((th) => th.textContent === "Why"));
    expect(await headers()).not.toContain("Why");
    await page.screenshot({ path: path.join(shots, "uncertain-390.png"), fullPage: true });
    expect(await rows.first().locator("td").nth(1).getByTestId("uncertain-reason").innerText()).toMatch(/low-confidence spans: \d+ of \d+|no entities suggested/);
    expect(await region.evaluate((el) => el.scrollWidth - el.clientWidth)).toBeLessThanOrEqual(0);
    expect(await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)).toBeLessThanOrEqual(0);
    await page.setViewportSize({ width: 1280, height: 860 });
    await page.waitForFunction(() => [...document.querySelectorAll("th")].some((th) => th.textContent === "Why"));

    await page.getByLabel("Select the top").fill("5");
    const ranking = await team.api.call<{ items: Array<{ id: string; title: string; score: number }> }>("GET", `/orgs/${team.orgId}/corpora/${team.corpusId}/uncertain?limit=5`);
    const titles = await rows.getByRole("link").allTextContents();
    expect(titles.slice(0, 5)).toEqual(ranking.items.map((d) => d.title));
    // Shown most uncertain first, and the reports with unfamiliar names are not all alike.
    const scores = (await rows.locator("td:nth-child(4)").allTextContents()).map(Number);
    expect(scores).toEqual([...scores].sort((a, b) => b - a));
    expect(new Set(scores).size).toBeGreaterThan(3);
    for (let i = 0; i < 14; i++) expect(await rows.nth(i).getByRole("checkbox").isChecked()).toBe(i < 5);

    await page.getByRole("link", { name: "Make a batch of 5…" }).click();
    await page.waitForURL((url) => url.pathname === `/o/${team.orgId}/batches/new`);
    const url = new URL(page.url());
    expect(url.searchParams.get("corpus")).toBe(team.corpusId);
    expect(url.searchParams.get("documents")!.split(",")).toEqual(ranking.items.map((d) => d.id));
    await page.getByLabel("Batch name").waitFor();
    await page.getByText("5 selected").waitFor();
    expect(errors).toEqual([]);
  });
});
