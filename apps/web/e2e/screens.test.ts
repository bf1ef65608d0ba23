import fs from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import axe from "axe-core";
import type { Page } from "playwright-core";
import { beforeAll, describe, expect, it } from "vitest";
import { ApiClient, type Person, type Team, setUpTeam, signIn } from "./support/annotation-team";
import { useBrowser, waitForEmail } from "./support/browser";

const session = useBrowser();
let team: Team;
let manager: Person;
let lead: Person;
let assignmentId = "";
let batchId = "";

// Screenshots are test artifacts (test-results/ is ignored by git): open them to look at the screens.
const shots = path.join(path.dirname(fileURLToPath(import.meta.url)), "..", "test-results", "screens");
const WIDTHS = [1440, 390] as const;

beforeAll(async () => {
  team = await setUpTeam(session.baseUrl, session.mailUrl, `s${Date.now().toString(36)}`);
  const [ines] = team.annotators;
  const batch = await team.api.call<{ id: string }>("POST", `/orgs/${team.orgId}/corpora/${team.corpusId}/batches`, {
    name: "Quay readings with a rather long name to test how titles wrap",
    dueDate: "2031-04-30",
    documentIds: Object.values(team.documents),
    assignment: { mode: "round_robin", annotatorIds: [ines.userId], annotatorsPerDocument: 1 },
  });
  batchId = batch.id;
  const annotator = new ApiClient(session.baseUrl);
  await annotator.call("POST", "/auth/sign-in", { email: ines.email, password: ines.password });
  const queue = await annotator.call<{ items: Array<{ assignmentId: string }> }>("GET", `/orgs/${team.orgId}/queue`);
  assignmentId = queue.items[0]!.assignmentId;
  manager = await join("Pell Orrin", "manager");
  lead = await join("Sable Wick", "data_lead");
  fs.mkdirSync(shots, { recursive: true });
}, 90_000);

/** A member who joined by invitation with a role. */
async function join(name: string, role: "manager" | "data_lead"): Promise<Person> {
  const email = `${role}-${Date.now().toString(36)}@example.test`;
  await team.api.call("POST", `/orgs/${team.orgId}/invitations`, { email, role });
  const mail = await waitForEmail(session.mailUrl, email, /invited to/);
  const token = decodeURIComponent(new URL(mail.link).pathname.split("/").pop()!);
  const password = "a long enough passphrase";
  const joined = await new ApiClient(session.baseUrl).call<{ user: { id: string } }>("POST", "/auth/sign-up", { email, password, name, invitationToken: token });
  return { name, email, password, userId: joined.user.id };
}

type Visit = { name: string; url: () => string; ready: (page: Page) => Promise<unknown> };

/** Opens a page at a width, recording every console message and page error from the first request on. */
async function openAt(width: number, who: Person | null) {
  const { page } = await session.newPage();
  await page.setViewportSize({ width, height: 860 });
  const messages: string[] = [];
  page.on("console", (m) => messages.push(`${m.type()}: ${m.text()}`));
  page.on("pageerror", (e) => messages.push(`pageerror: ${e.message}`));
  if (who) await signIn(page, who);
  return { page, messages };
}

/** How far the page is wider than the window (0 when nothing scrolls sideways), with the outermost elements that stick out. */
async function horizontalOverflow(page: Page): Promise<{ by: number; culprits: string[] }> {
  return page.evaluate(() => {
    const width = document.documentElement.clientWidth;
    const out = [...document.body.querySelectorAll<HTMLElement>("*")].filter((el) => el.getBoundingClientRect().right > width + 1);
    const outermost = out.filter((el) => !out.includes(el.parentElement!));
    return {
      by: document.documentElement.scrollWidth - width,
      culprits: outermost.slice(0, 5).map((el) => `${el.tagName.toLowerCase()}.${el.className}`.slice(0, 120)),
    };
  });
}

/** axe-core's serious and critical findings on the page as it stands. */
async function seriousViolations(page: Page): Promise<string[]> {
  // Evaluated over the debugging protocol, so the app's Content-Security-Policy (script-src 'self') stays as it is.
  await page.evaluate(axe.source);
  const found = await page.evaluate(async () => {
    const result = await (window as unknown as { axe: typeof axe }).axe.run(document, { resultTypes: ["violations"] });
    return result.violations.map((v) => ({ id: v.id, impact: v.impact, nodes: v.nodes.map((n) => n.target.join(" ")).slice(0, 3) }));
  });
  return found.filter((v) => v.impact === "serious" || v.impact === "critical").map((v) => `${v.id} (${v.impact}): ${v.nodes.join(", ")}`);
}

async function checkScreens(who: Person | null, label: string, visits: Visit[]) {
  for (const width of WIDTHS) {
    const { page, messages } = await openAt(width, who);
    for (const v of visits) {
      await page.goto(v.url());
      await v.ready(page);
      // Let late requests (and their console messages) land before judging the page.
      await page.waitForLoadState("networkidle");
      await page.screenshot({ path: path.join(shots, `${label}-${v.name}-${width}.png`), fullPage: true });
      const overflow = await horizontalOverflow(page);
      expect(overflow.by, `${v.name} at ${width} px scrolls sideways: ${overflow.culprits.join(" | ")}`).toBeLessThanOrEqual(0);
      expect(await seriousViolations(page), `${v.name} at ${width} px: axe`).toEqual([]);
      expect(messages, `${v.name} at ${width} px: console`).toEqual([]);
    }
  }
}

const org = (rest = "") => `/o/${team.orgId}${rest}`;
const corpus = (rest = "") => org(`/corpora/${team.corpusId}${rest}`);
const heading = (name: string | RegExp) => (page: Page) => page.getByRole("heading", { name, level: 1 }).waitFor();

describe("the main screens at 1440 and 390 px (axe at both widths)", () => {
  it("the sign-in page: no overflow, no console message (no 401 for the signed-out visitor), no serious axe finding", async () => {
    await checkScreens(null, "signed-out", [{ name: "sign-in", url: () => "/sign-in", ready: heading("Sign in") }]);
  });

  it("an admin's screens", async () => {
    await checkScreens(team.manager, "admin", [
      { name: "overview", url: () => org(), ready: (p) => p.getByRole("region", { name: "Seats" }).getByText(/seats on the/).waitFor() },
      { name: "corpora", url: () => org("/corpora"), ready: heading("Corpora") },
      { name: "documents", url: () => corpus(), ready: (p) => p.getByRole("link", { name: "Harbour log" }).waitFor() },
      { name: "schema", url: () => corpus("/schema"), ready: (p) => p.getByRole("list", { name: "Entity types" }).getByTitle("PERSON").waitFor() },
      { name: "uploads", url: () => corpus("/uploads"), ready: (p) => p.getByText("Documents may hold personal data.").waitFor() },
      { name: "document", url: () => corpus(`/documents/${team.documents["Harbour log"]}`), ready: (p) => p.getByText(/Ostrandel/).first().waitFor() },
      { name: "batches", url: () => org("/batches"), ready: heading("Batches") },
      { name: "batch", url: () => corpus(`/batches/${batchId}`), ready: heading(/Quay readings/) },
      { name: "review", url: () => org("/review"), ready: heading(/Review/) },
      { name: "members", url: () => org("/members"), ready: (p) => p.getByText("Ines Marrow").first().waitFor() },
      { name: "audit", url: () => org("/audit"), ready: (p) => p.getByRole("table", { name: "Audit events" }).waitFor() },
      { name: "billing", url: () => org("/billing"), ready: heading(/Billing/) },
      { name: "settings", url: () => org("/settings"), ready: heading(/Settings|Organization/) },
    ]);
  });

  it("a manager's screens: batch progress and documents by status; the organization's settings are not offered", async () => {
    await checkScreens(manager, "manager", [
      {
        name: "overview",
        url: () => org(),
        ready: async (p) => {
          await p.getByRole("region", { name: "Documents by status" }).getByText("In a batch").waitFor();
          await p.getByRole("region", { name: "Agreement trend" }).getByText(/No agreement yet/).waitFor();
        },
      },
      { name: "batch", url: () => corpus(`/batches/${batchId}`), ready: heading(/Quay readings/) },
      { name: "settings", url: () => org("/settings"), ready: heading("Not available to your role") },
    ]);
  });

  it("a data lead's screens: suggesters and runs", async () => {
    await checkScreens(lead, "lead", [
      { name: "overview", url: () => org(), ready: (p) => p.getByRole("region", { name: "Taggers and runs" }).getByText("No training runs yet.").waitFor() },
      { name: "documents", url: () => corpus(), ready: (p) => p.getByRole("link", { name: "Harbour log" }).waitFor() },
    ]);
  });

  it("an annotator's screens", async () => {
    const [ines] = team.annotators;
    await checkScreens(ines, "annotator", [
      { name: "overview", url: () => org(), ready: (p) => p.getByRole("region", { name: "My open work" }).getByRole("link", { name: "Harbour log" }).waitFor() },
      { name: "queue", url: () => org("/queue"), ready: (p) => p.getByRole("link", { name: /^Start next/ }).waitFor() },
      { name: "workspace", url: () => corpus(`/assignments/${assignmentId}`), ready: (p) => p.getByTestId("document-text").waitFor() },
    ]);
  });
});

describe("what an annotator may not see", () => {
  it("no corpus gold or uploads: the screens say so and the API answers 403", async () => {
    const [ines] = team.annotators;
    const { page, messages } = await openAt(1440, ines);
    await page.goto(corpus());
    await page.getByText(/not for your role|annotators|not allowed/i).first().waitFor();
    expect(await page.getByRole("link", { name: "Harbour log" }).count()).toBe(0);
    await page.goto(corpus("/uploads"));
    await page.getByText(/not for your role|annotators|not allowed/i).first().waitFor();
    expect(await page.getByText("Documents may hold personal data.").count()).toBe(0);
    for (const p of ["/documents", "/uploads", `/documents/${team.documents["Harbour log"]}`]) {
      const res = await page.request.get(`/api/orgs/${team.orgId}/corpora/${team.corpusId}${p}`);
      expect(res.status(), p).toBe(403);
    }
    // The navigation offers no corpus browsing to an annotator.
    expect(await page.getByRole("navigation", { name: "Areas" }).getByRole("link", { name: "Corpora" }).count()).toBe(0);
    expect(messages).toEqual([]);
  });
});

describe("the details people rely on", () => {
  it("queue: Start next keeps its place and submitted work moves to Done; the save badge says what is true; the nav and back links name the right area", async () => {
    const [ines] = team.annotators;
    const annotator = new ApiClient(session.baseUrl);
    await annotator.call("POST", "/auth/sign-in", { email: ines.email, password: ines.password });
    const base = `/orgs/${team.orgId}/corpora/${team.corpusId}/assignments/${assignmentId}`;
    const opened = await annotator.call<{ version: number; document: { title: string; text: string } }>("GET", base);
    const saved = await annotator.call<{ version: number }>("PUT", base, { version: opened.version, spans: [{ start: 0, end: 4, type: "PERSON" }], dismissedSuggestions: [] });
    const title = opened.document.title;

    const { page, messages } = await openAt(1440, ines);
    const current = () => page.getByRole("navigation", { name: "Areas" }).locator('[aria-current="page"]').textContent();
    // Start next comes first in its box, left of the title, so a long title cannot push it about.
    await page.goto(org("/queue"));
    const start = page.getByRole("link", { name: /^Start next/ });
    await start.waitFor();
    const box = (await start.boundingBox())!;
    const titleBox = (await page.getByText(title, { exact: true }).first().boundingBox())!;
    expect(box.x).toBeLessThan(titleBox.x);
    expect(await current()).toBe("My queue");

    // A reload of saved work says when it was saved, not "No changes yet".
    await page.goto(corpus(`/assignments/${assignmentId}`));
    await page.getByTestId("document-text").waitFor();
    expect(await current()).toBe("My queue");
    await page.reload();
    await page.getByTestId("document-text").waitFor();
    expect(await page.locator("[data-save-state]").textContent()).toMatch(/^Saved \d{1,2}[:.]\d{2}/);
    await annotator.call("POST", `${base}/submit`, { version: saved.version });
    await page.reload();
    await page.getByTestId("document-text").waitFor();
    expect(await page.locator("[data-save-state]").textContent()).toBe("Submitted");

    // Submitted work is listed under Done.
    await page.goto(org("/queue"));
    await page.getByRole("heading", { name: "Done" }).waitFor();
    await page.getByRole("table", { name: "Done" }).getByRole("link", { name: title }).waitFor();
    expect(messages).toEqual([]);

    // The manager: batch and review pages belong to Batches and Review, and the read-only
    // assignment opened from a review goes back to it.
    const m = await openAt(1440, team.manager);
    const mcurrent = () => m.page.getByRole("navigation", { name: "Areas" }).locator('[aria-current="page"]').textContent();
    await m.page.goto(corpus(`/batches/${batchId}`));
    await heading(/Quay readings/)(m.page);
    expect(await mcurrent()).toBe("Batches");
    await m.page.getByRole("table", { name: "Documents of the batch" }).getByRole("link", { name: /Review/ }).first().click();
    await m.page.getByRole("heading", { name: `Review: ${title}` }).waitFor();
    expect(await mcurrent()).toBe("Review");
    await m.page.getByRole("link", { name: "Open read-only" }).click();
    await m.page.getByTestId("document-text").waitFor();
    expect(await mcurrent()).toBe("Review");
    await m.page.getByRole("link", { name: "← Review" }).click();
    await m.page.getByRole("heading", { name: `Review: ${title}` }).waitFor();
    expect(m.messages).toEqual([]);
  });
});

describe("on a phone", () => {
  it("a batch with two annotators per document: the agreement table and chart fit 390 px, with no serious axe finding", async () => {
    const [ines, jory] = team.annotators;
    const docId = team.documents["Ferry notes"]!;
    const batch = await team.api.call<{ id: string }>("POST", `/orgs/${team.orgId}/corpora/${team.corpusId}/batches`, {
      name: "Ferry overlap",
      documentIds: [docId],
      assignment: { mode: "round_robin", annotatorIds: [ines.userId, jory.userId], annotatorsPerDocument: 2 },
    });
    // Ines marks two names, Jory one of them and a third: they agree on one span.
    const spans = { [ines.email]: [{ start: 0, end: 9, type: "PERSON" }, { start: 30, end: 39, type: "PLACE" }], [jory.email]: [{ start: 0, end: 9, type: "PERSON" }, { start: 43, end: 50, type: "PLACE" }] };
    for (const person of [ines, jory]) {
      const api = new ApiClient(session.baseUrl);
      await api.call("POST", "/auth/sign-in", { email: person.email, password: person.password });
      const queue = await api.call<{ items: Array<{ assignmentId: string; batchId: string }> }>("GET", `/orgs/${team.orgId}/queue`);
      const id = queue.items.find((i) => i.batchId === batch.id)!.assignmentId;
      const base = `/orgs/${team.orgId}/corpora/${team.corpusId}/assignments/${id}`;
      const opened = await api.call<{ version: number }>("GET", base);
      const saved = await api.call<{ version: number }>("PUT", base, { version: opened.version, spans: spans[person.email], dismissedSuggestions: [] });
      await api.call("POST", `${base}/submit`, { version: saved.version });
    }
    for (const width of WIDTHS) {
      const { page, messages } = await openAt(width, team.manager);
      await page.goto(corpus(`/batches/${batch.id}`));
      await page.getByRole("table", { name: "Agreement per pair of annotators" }).getByRole("row", { name: /Ines Marrow & Jory Ashby/ }).waitFor();
      await page.getByRole("img", { name: "Agreement per pair: entity F1 and kappa" }).locator(".recharts-bar-rectangle").first().waitFor();
      await page.waitForLoadState("networkidle");
      await page.screenshot({ path: path.join(shots, `manager-agreement-${width}.png`), fullPage: true });
      const overflow = await horizontalOverflow(page);
      expect(overflow.by, `batch at ${width} px scrolls sideways: ${overflow.culprits.join(" | ")}`).toBeLessThanOrEqual(0);
      expect(await seriousViolations(page), `batch at ${width} px: axe`).toEqual([]);
      expect(messages).toEqual([]);
    }
  });

  it("the workspace's text box is as tall as a short text, and a long one scrolls inside 70 % of the screen", async () => {
    const [ines] = team.annotators;
    const { page, messages } = await openAt(390, ines);
    await page.goto(corpus(`/assignments/${assignmentId}`));
    const box = page.getByTestId("document-text");
    await box.waitFor();
    const { height } = (await box.boundingBox())!;
    // A two-sentence document takes a few lines at 390 px; the box was 70 % of the screen whatever the text.
    expect(height).toBeLessThan(860 * 0.4);
    expect(await box.evaluate((el) => getComputedStyle(el).maxHeight)).toBe(`${860 * 0.7}px`);
    expect(messages).toEqual([]);
  });
});
