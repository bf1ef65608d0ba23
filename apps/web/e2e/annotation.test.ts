import type { Page } from "playwright-core";
import { beforeAll, describe, expect, it } from "vitest";
import { type Team, TEXTS, at, setUpTeam, signIn, waitSaved } from "./support/annotation-team";
import { useBrowser, waitForEmail } from "./support/browser";

const session = useBrowser();
let team: Team;

beforeAll(async () => {
  team = await setUpTeam(session.baseUrl, session.mailUrl, Date.now().toString(36));
}, 90_000);

/** The spans drawn in the workspace, as "TYPE:text". */
async function marks(page: Page): Promise<string[]> {
  return page.locator("[data-testid=document-text] mark[data-span]").evaluateAll((els) =>
    els.map((el) => `${el.getAttribute("data-type")}:${[...el.querySelectorAll("[data-t]")].map((t) => t.textContent).join(" ")}`),
  );
}

async function pressKeys(page: Page, keys: string[]): Promise<void> {
  for (const k of keys) await page.keyboard.press(k);
}

describe("annotation in the browser", () => {
  it("batch → keyboard and mouse spans, undo, reload → submit → sent back by e-mail → fixed → accepted → exported as gold", async () => {
    const docId = team.documents["Harbour log"]!;
    const [ines] = team.annotators;

    // The manager makes a batch from a Documents-table selection (the link carries it).
    const { page: mgr } = await session.newPage();
    await signIn(mgr, team.manager, `/o/${team.orgId}/batches/new?corpus=${team.corpusId}&documents=${docId}`);
    await mgr.getByLabel("Batch name").fill("Harbour week");
    await mgr.getByLabel("Due date").fill("2031-06-30");
    await mgr.getByText("1 selected").waitFor();
    await mgr.getByRole("checkbox", { name: /Ines Marrow/ }).check();
    await mgr.getByRole("button", { name: "Create batch and notify annotators" }).click();
    await mgr.getByRole("heading", { name: "Harbour week" }).waitFor();
    await mgr.getByText("Ines Marrow: Not started").waitFor();

    // The annotator follows the e-mail to the queue and opens the next document.
    const mail = await waitForEmail(session.mailUrl, ines.email, /New batch to annotate: Harbour week/);
    expect(mail.text).toContain("30 June 2031");
    const { page } = await session.newPage();
    const errors: string[] = [];
    page.on("pageerror", (e) => errors.push(e.message));
    await signIn(page, ines, new URL(mail.link).pathname);
    await page.getByRole("heading", { name: "My queue" }).waitFor();
    await page.getByRole("link", { name: "Start next: Harbour log" }).click();
    const text = page.getByTestId("document-text");
    await text.waitFor();
    // The schema with keys is on screen, and the suggestion is drawn apart with its confidence.
    await page.getByRole("region", { name: "Entity types" }).getByText("PERSON").waitFor();
    await page.getByTitle("Suggestion: PERSON, 93% confident").waitFor();

    // Three spans with the keyboard only: the cursor starts on "Mira".
    await expect(text.evaluate((el) => el === document.activeElement)).resolves.toBe(true);
    await pressKeys(page, ["Shift+ArrowRight", "p"]); // Mira Quell → PERSON
    await pressKeys(page, ["ArrowRight", "ArrowRight", "Shift+ArrowRight", "p"]); // Tobin Vale → PERSON
    await pressKeys(page, ["ArrowRight", "ArrowRight", "ArrowRight", "l"]); // Saltmarsh → PLACE
    // An overlapping selection is refused with the reason.
    await pressKeys(page, ["Shift+ArrowRight", "o"]);
    await page.getByText(/Spans cannot overlap: "Saltmarsh" is already PLACE/).waitFor();
    await page.keyboard.press("Escape");
    // One with the mouse: drag across "Ostrandel Freight", pick ORG from the menu.
    const from = text.locator("[data-t]", { hasText: /^Ostrandel$/ });
    const to = text.locator("[data-t]", { hasText: /^Freight$/ });
    const a = (await from.boundingBox())!;
    const b = (await to.boundingBox())!;
    await page.mouse.move(a.x + 3, a.y + a.height / 2);
    await page.mouse.down();
    await page.mouse.move(b.x + b.width / 2, b.y + b.height / 2, { steps: 5 });
    await page.mouse.up();
    await page.getByRole("menu").getByRole("menuitem", { name: /ORG/ }).click();
    expect(await marks(page)).toEqual(["PERSON:Mira Quell", "PERSON:Tobin Vale", "PLACE:Saltmarsh", "ORG:Ostrandel Freight"]);
    // Undo the last one.
    await page.keyboard.press("Control+z");
    expect(await marks(page)).toEqual(["PERSON:Mira Quell", "PERSON:Tobin Vale", "PLACE:Saltmarsh"]);
    await waitSaved(page);
    await page.reload();
    await text.waitFor();
    expect(await marks(page)).toEqual(["PERSON:Mira Quell", "PERSON:Tobin Vale", "PLACE:Saltmarsh"]);
    await page.getByRole("button", { name: "Submit for review" }).click();
    await page.getByRole("button", { name: "Submit", exact: true }).click();
    await page.getByText("Submitted for review. It is read-only now.").waitFor();

    // The manager sends it back with a comment.
    await mgr.reload();
    await mgr.getByRole("table", { name: "Documents of the batch" }).getByRole("link", { name: /Review/ }).click();
    await mgr.getByRole("heading", { name: "Review: Harbour log" }).waitFor();
    await mgr.getByRole("button", { name: "Send back…" }).click();
    await mgr.getByLabel("Comment for Ines Marrow").fill("The place is the whole Saltmarsh depot.");
    await mgr.getByRole("button", { name: "Send back to Ines Marrow" }).click();
    await mgr.getByText("Ines Marrow: Sent back").waitFor();

    // The e-mail arrives with the comment and a link straight to the document.
    const back = await waitForEmail(session.mailUrl, ines.email, /Sent back for changes: Harbour log/);
    expect(back.text).toContain("The place is the whole Saltmarsh depot.");
    await page.goto(new URL(back.link).pathname);
    await page.getByText("Sent back by the reviewer:").waitFor();
    await text.waitFor();
    // Fix: remove PLACE "Saltmarsh" and mark "Saltmarsh depot" instead, all with keys.
    await pressKeys(page, ["ArrowRight", "ArrowRight", "ArrowRight", "ArrowRight", "ArrowRight", "ArrowRight", "ArrowRight", "Delete", "Shift+ArrowRight", "l"]);
    expect(await marks(page)).toEqual(["PERSON:Mira Quell", "PERSON:Tobin Vale", "PLACE:Saltmarsh depot"]);
    // Accept the suggestion with Enter after jumping to it.
    await pressKeys(page, ["]", "Enter"]);
    expect(await marks(page)).toContain("PERSON:Orla Finch");
    await waitSaved(page);
    await page.getByRole("button", { name: "Submit for review" }).click();
    await page.getByRole("button", { name: "Submit", exact: true }).click();
    await page.getByText("Submitted for review. It is read-only now.").waitFor();

    // The manager accepts: the document becomes gold, and the export has the spans.
    await mgr.reload();
    await mgr.getByRole("table", { name: "Documents of the batch" }).getByRole("link", { name: /Review/ }).click();
    await mgr.getByRole("button", { name: "Accept as gold" }).click();
    await mgr.getByRole("table", { name: "Documents of the batch" }).getByText("Gold", { exact: true }).waitFor();
    const exported = await mgr.request.get(`/api/orgs/${team.orgId}/corpora/${team.corpusId}/exports?format=jsonl`);
    expect(exported.status()).toBe(200);
    const line = (await exported.text())
      .split("\n")
      .filter(Boolean)
      .map((l) => JSON.parse(l) as { title: string; spans: Array<{ start: number; end: number; type: string }> })
      .find((l) => l.title === "Harbour log")!;
    const t = TEXTS.harbour;
    expect(line.spans.map(({ start, end, type }) => ({ start, end, type }))).toEqual([
      { ...at(t, "Mira Quell"), type: "PERSON" },
      { ...at(t, "Tobin Vale"), type: "PERSON" },
      { ...at(t, "Saltmarsh depot"), type: "PLACE" },
      { ...at(t, "Orla Finch"), type: "PERSON" },
    ]);
    expect(errors).toEqual([]);
  });

  it("two annotators on one document: the manager sees agreement, settles the disagreement and accepts the result", async () => {
    const docId = team.documents["Ferry notes"]!;
    const [ines, jory] = team.annotators;
    await team.api.call("POST", `/orgs/${team.orgId}/corpora/${team.corpusId}/batches`, {
      name: "Ferry overlap",
      documentIds: [docId],
      assignment: { mode: "round_robin", annotatorIds: [ines.userId, jory.userId], annotatorsPerDocument: 2 },
    });
    // Tokens: Edda0 Rusk1 took2 the3 ferry4 from5 Gullhaven6 to7 Lowmere8 Quay9 .10 The11 Corran12 Line13
    const work: Array<[typeof ines, string[]]> = [
      [ines, ["Shift+ArrowRight", "p", "ArrowRight", "ArrowRight", "ArrowRight", "ArrowRight", "ArrowRight", "l", "ArrowRight", "ArrowRight", "Shift+ArrowRight", "l"]],
      [jory, ["Shift+ArrowRight", "p", "ArrowRight", "ArrowRight", "ArrowRight", "ArrowRight", "ArrowRight", "l", "ArrowRight", "ArrowRight", "l", "ArrowRight", "ArrowRight", "ArrowRight", "ArrowRight", "Shift+ArrowRight", "o"]],
    ];
    for (const [person, keys] of work) {
      const { page } = await session.newPage();
      await signIn(page, person, `/o/${team.orgId}/queue`);
      await page.getByRole("link", { name: "Ferry notes", exact: true }).click();
      await page.getByTestId("document-text").waitFor();
      await pressKeys(page, keys);
      await waitSaved(page);
      await page.getByRole("button", { name: "Submit for review" }).click();
      await page.getByRole("button", { name: "Submit", exact: true }).click();
      await page.getByText("Submitted for review. It is read-only now.").waitFor();
    }

    const { page: mgr } = await session.newPage();
    await signIn(mgr, team.manager, `/o/${team.orgId}/batches`);
    await mgr.getByRole("link", { name: "Ferry overlap" }).click();
    // Agreement: PERSON and PLACE Gullhaven alike; Ines has "Lowmere Quay", Jory "Lowmere" and an ORG.
    // Entity F1 = 2·2 / (3 + 4) = 0.57 (worked by hand).
    const pair = mgr.getByRole("table", { name: "Agreement per pair of annotators" }).getByRole("row", { name: /Ines Marrow & Jory Ashby/ });
    await pair.waitFor();
    expect(await pair.textContent()).toContain("0.57");
    await mgr.getByRole("img", { name: "Agreement per pair: entity F1 and kappa" }).waitFor();
    await mgr.getByRole("table", { name: "Documents of the batch" }).getByRole("link", { name: /Review/ }).click();
    await mgr.getByRole("heading", { name: "Disagreements (2)" }).waitFor();
    // Take Ines's "Lowmere Quay" and Jory's ORG.
    const items = mgr.getByRole("listitem").filter({ has: mgr.getByRole("radio") });
    await items.nth(0).getByRole("radio", { name: /Ines Marrow/ }).check();
    await items.nth(1).getByRole("radio", { name: /Jory Ashby/ }).check();
    await mgr.getByRole("button", { name: /Accept the settled result as gold \(4 spans\)/ }).click();
    await mgr.getByRole("table", { name: "Documents of the batch" }).getByText("Gold", { exact: true }).waitFor();
    const exported = await mgr.request.get(`/api/orgs/${team.orgId}/corpora/${team.corpusId}/exports?format=jsonl`);
    const line = (await exported.text())
      .split("\n")
      .filter(Boolean)
      .map((l) => JSON.parse(l) as { title: string; spans: Array<{ start: number; end: number; type: string }> })
      .find((l) => l.title === "Ferry notes")!;
    const t = TEXTS.ferry;
    expect(line.spans.map(({ start, end, type }) => ({ start, end, type }))).toEqual([
      { ...at(t, "Edda Rusk"), type: "PERSON" },
      { ...at(t, "Gullhaven"), type: "PLACE" },
      { ...at(t, "Lowmere Quay"), type: "PLACE" },
      { ...at(t, "Corran Line"), type: "ORG" },
    ]);
  });
});
