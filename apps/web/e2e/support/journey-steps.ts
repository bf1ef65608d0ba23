import fs from "node:fs";
import path from "node:path";
import type { Browser, BrowserContext, Locator, Page, Request } from "playwright-core";
import { API_TEXT, journeyFiles } from "./journey-data";

// The whole job in one ordered walk through the UI alone, shared by the browser test
// (e2e/full-journey.test.ts) and the timings benchmark (e2e/bench/journey-timings.ts). Each step
// records its browser time (wall clock of the step) and the API time the browser saw (the time in
// which at least one /api request of the step was in flight, from the browser's resource timing),
// and fails on any console error, page error, failed request or 5xx answer.

/** Every wait of playwright is bounded by this, unless a step says otherwise. */
const WAIT_MS = 20_000;
/** Training a tagger and tagging the open documents run in the worker. */
const JOB_WAIT_MS = 90_000;
const PASSWORD = "a long enough passphrase";

export type Role = "admin" | "manager" | "annotator1" | "annotator2" | "lead";

type Member = { role: Role; name: string; email: string; apiRole: string; context: BrowserContext | null; page: Page | null };

export type StepTiming = {
  name: string;
  /** Wall-clock time of the step, screenshots excluded (ms). */
  browserMs: number;
  /** Time during which at least one API request of the step was in flight (ms). */
  apiMs: number;
  apiRequests: number;
  /** The slowest API request of the step: its duration and "METHOD /path". */
  slowestMs: number;
  slowest: string;
};

export type JourneyStep = { name: string; timeoutMs: number; run: (j: Journey) => Promise<void> };

export type JourneyOptions = {
  browser: Browser;
  baseUrl: string;
  mailUrl?: string;
  /** Where the per-step screenshots go; null for none. */
  artifactsDir: string | null;
  /** Only the screenshot of a failed step (keeps timing runs free of screenshot work). */
  screenshotFailuresOnly?: boolean;
  /** Makes the e-mail addresses and names unique on a shared product. */
  stamp: string;
  /** What the product's processes printed last, added to a failed step's message. */
  logTail?: () => string;
};

class JourneyError extends Error {}

/** Throws with `message` unless `ok`. */
function check(ok: unknown, message: string): asserts ok {
  if (!ok) throw new JourneyError(message);
}

/** Waits until `read()` satisfies `ok`, polling; bounded by `timeoutMs`. */
async function poll<T>(read: () => Promise<T>, ok: (v: T) => boolean, what: string, timeoutMs = WAIT_MS): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  let last: T = await read();
  while (!ok(last)) {
    if (Date.now() > deadline) throw new JourneyError(`${what}: still ${JSON.stringify(last)} after ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 100));
    last = await read();
  }
  return last;
}

/** Length of the union of intervals (ms). */
function unionLength(intervals: Array<[number, number]>): number {
  const sorted = [...intervals].sort((a, b) => a[0] - b[0]);
  let total = 0;
  let end = -Infinity;
  for (const [s, e] of sorted) {
    if (e <= end) continue;
    total += e - Math.max(s, end);
    end = e;
  }
  return total;
}

type ApiRecord = { interval: [number, number]; label: string; role: Role };

/** One walk: the browser contexts of its people, what it has made so far, and its timings. */
export class Journey {
  readonly timings: StepTiming[] = [];
  readonly problems: string[] = [];
  /** From the admin's first sign-in (sign-up) to the first suggestion an annotator sees, screenshots excluded (ms). */
  signInToSuggestionMs: number | null = null;
  readonly people: Record<Role, Member>;
  orgId = "";
  corpusId = "";
  apiToken = "";
  readonly corpusName: string;
  readonly orgName: string;
  readonly files = journeyFiles();
  /** Every API request of the walk, in wall-clock ms (the browser's resource timing). */
  private readonly api: ApiRecord[] = [];
  private signInAt: number | null = null;
  private shotMs = 0;
  private shotsAtSignIn = 0;
  private failedStep: string | null = null;

  constructor(readonly options: JourneyOptions) {
    const s = options.stamp;
    const person = (role: Role, name: string, apiRole: string): Member => ({ role, name, email: `${role}-${s}@example.test`, apiRole, context: null, page: null });
    this.people = {
      admin: person("admin", "Sefa Corrow", "admin"),
      manager: person("manager", "Hale Brannock", "manager"),
      annotator1: person("annotator1", "Ines Marrow", "annotator"),
      annotator2: person("annotator2", "Jory Ashby", "annotator"),
      lead: person("lead", "Nessa Dunmere", "data_lead"),
    };
    this.orgName = `Wharfside Ledger ${s}`;
    this.corpusName = "Quay papers";
  }

  /** Runs one step: bounded, timed, screenshotted; any problem in the browser fails it. */
  async run(step: JourneyStep): Promise<void> {
    if (this.failedStep) throw new JourneyError(`not run: the step "${this.failedStep}" failed before it`);
    const problemsBefore = this.problems.length;
    this.lastPage = null;
    this.stepRoles.clear();
    const started = performance.now();
    const from = Date.now();
    let timer: NodeJS.Timeout | undefined;
    try {
      await Promise.race([
        step.run(this),
        new Promise<never>((_, reject) => {
          timer = setTimeout(() => reject(new JourneyError(`the step took longer than ${step.timeoutMs} ms`)), step.timeoutMs);
        }),
      ]);
    } catch (err) {
      this.failedStep = step.name;
      await this.screenshot(`${step.name} (failed)`, true).catch(() => undefined);
      throw await this.explain(err);
    } finally {
      clearTimeout(timer);
    }
    const browserMs = performance.now() - started;
    const to = Date.now();
    // A request the step started counts towards it (up to the step's end); let the last ones report.
    await new Promise((r) => setTimeout(r, 50));
    // Only the people acting in the step: a page left open elsewhere (polling) is not its cost.
    const records = this.api.filter((r) => r.interval[0] >= from && r.interval[0] <= to && this.stepRoles.has(r.role));
    const slowest = records.reduce<ApiRecord | null>((a, r) => (!a || r.interval[1] - r.interval[0] > a.interval[1] - a.interval[0] ? r : a), null);
    this.timings.push({
      name: step.name,
      browserMs,
      apiMs: unionLength(records.map((r): [number, number] => [r.interval[0], Math.min(r.interval[1], to)])),
      apiRequests: records.length,
      slowestMs: slowest ? slowest.interval[1] - slowest.interval[0] : 0,
      slowest: slowest?.label ?? "",
    });
    await this.screenshot(step.name);
    const fresh = this.problems.slice(problemsBefore);
    if (fresh.length) {
      this.failedStep = step.name;
      throw new JourneyError(`problems in the browser during "${step.name}":\n${fresh.join("\n")}`);
    }
  }

  /** The failure with what the page showed and what the product printed last, so a run elsewhere (CI) tells why. */
  private async explain(err: unknown): Promise<unknown> {
    if (!(err instanceof Error)) return err;
    const page = this.lastPage;
    const shown = page && !page.isClosed() ? await page.locator("main").innerText({ timeout: 2000 }).catch(() => "(no main region)") : "(no page)";
    const printed = this.options.logTail?.() ?? "";
    err.message += `\n--- the page showed (${page?.url() ?? "no page"}):\n${shown.slice(0, 2000)}${printed ? `\n--- the product printed last:\n${printed}` : ""}`;
    return err;
  }

  /** Marks the admin's first sign-in: the start of "sign-in to first suggestion". */
  markSignIn(): void {
    this.signInAt = performance.now();
    this.shotsAtSignIn = this.shotMs;
  }

  /** Marks the first suggestion seen. */
  markSuggestionSeen(): void {
    if (this.signInAt === null || this.signInToSuggestionMs !== null) return;
    this.signInToSuggestionMs = performance.now() - this.signInAt - (this.shotMs - this.shotsAtSignIn);
  }

  /** The person's page, opening a fresh browser context (own cookies) the first time. */
  async page(role: Role): Promise<Page> {
    const m = this.people[role];
    if (m.page) return m.page;
    const context = await this.options.browser.newContext({ baseURL: this.options.baseUrl, viewport: { width: 1440, height: 900 } });
    context.setDefaultTimeout(WAIT_MS);
    context.setDefaultNavigationTimeout(WAIT_MS);
    await context.route(/^https?:\/\/(?!127\.0\.0\.1[:/])/, (route) => {
      this.problems.push(`${role}: request to another host ${route.request().url()}`);
      return route.abort();
    });
    context.on("console", (msg) => {
      if (msg.type() === "error") this.problems.push(`${role}: console error: ${msg.text()} (${msg.location().url})`);
    });
    context.on("weberror", (e) => this.problems.push(`${role}: page error: ${e.error().message}`));
    context.on("requestfailed", (r) => {
      // A request the browser dropped because the page navigated on is no failure.
      if (r.failure()?.errorText === "net::ERR_ABORTED") return;
      this.problems.push(`${role}: request failed: ${r.method()} ${r.url()} ${r.failure()?.errorText ?? ""}`);
    });
    context.on("response", (r) => {
      if (r.status() >= 500) this.problems.push(`${role}: ${r.status()} from ${r.request().method()} ${r.url()}`);
    });
    context.on("requestfinished", (r) => this.recordApi(r, role));
    m.context = context;
    m.page = await context.newPage();
    return m.page;
  }

  private recordApi(r: Request, role: Role): void {
    const url = new URL(r.url());
    if (url.origin !== this.options.baseUrl || !url.pathname.startsWith("/api/")) return;
    const t = r.timing();
    if (t.responseEnd < 0) return;
    const start = t.startTime + Math.max(0, t.requestStart);
    this.api.push({ interval: [start, t.startTime + t.responseEnd], label: `${r.method()} ${url.pathname.replace(/[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}/g, ":id")}`, role });
  }

  /** Saves the page last used by each person who has one open, as `NN-step-role.png`. */
  private async screenshot(name: string, failed = false): Promise<void> {
    const dir = this.options.artifactsDir;
    if (!dir || (this.options.screenshotFailuresOnly && !failed)) return;
    const t = performance.now();
    fs.mkdirSync(dir, { recursive: true });
    const slug = name.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "");
    const page = this.lastPage;
    if (page && !page.isClosed()) await page.screenshot({ path: path.join(dir, `${String(this.timings.length + (failed ? 1 : 0)).padStart(2, "0")}-${slug}.png`), fullPage: true, timeout: WAIT_MS });
    this.shotMs += performance.now() - t;
  }

  /** Counts a request the test made itself (not the browser) as API time of the step. */
  recordFetch(startedAt: number, label: string): void {
    this.api.push({ interval: [startedAt, Date.now()], label, role: "lead" });
    this.stepRoles.add("lead");
  }

  /** Who acts in the current step. */
  private readonly stepRoles = new Set<Role>();

  /** The page the current step worked in last (for its screenshot). */
  lastPage: Page | null = null;

  /** The person's page, remembered as the one to screenshot. */
  async use(role: Role): Promise<Page> {
    const page = await this.page(role);
    this.stepRoles.add(role);
    this.lastPage = page;
    return page;
  }

  async close(): Promise<void> {
    for (const m of Object.values(this.people)) await m.context?.close().catch(() => undefined);
  }
}

/** Presses keys one after another. */
async function press(page: Page, keys: string[]): Promise<void> {
  for (const k of keys) await page.keyboard.press(k);
}

/** Drags the mouse from one token to another in the workspace text, then picks a type from the menu. */
async function dragSpan(page: Page, from: string, to: string, type: string): Promise<void> {
  const text = page.getByTestId("document-text");
  const a = await text.locator("[data-t]", { hasText: new RegExp(`^${from}$`) }).boundingBox();
  const b = await text.locator("[data-t]", { hasText: new RegExp(`^${to}$`) }).boundingBox();
  check(a && b, `tokens "${from}" and "${to}" are on screen`);
  await page.mouse.move(a.x + 3, a.y + a.height / 2);
  await page.mouse.down();
  await page.mouse.move(b.x + b.width / 2, b.y + b.height / 2, { steps: 5 });
  await page.mouse.up();
  await page.getByRole("menu").getByRole("menuitem", { name: new RegExp(type) }).click();
}

/** The spans drawn in the workspace, as "TYPE:text". */
async function marks(page: Page): Promise<string[]> {
  return page.locator("[data-testid=document-text] mark[data-span]").evaluateAll((els) =>
    els.map((el) => `${el.getAttribute("data-type")}:${[...el.querySelectorAll("[data-t]")].map((t) => t.textContent).join(" ")}`),
  );
}

async function waitSaved(page: Page): Promise<void> {
  await page.locator('[data-save-state="saved"][data-saved-at]').getByText(/^Saved /).waitFor();
}

function areas(page: Page): Locator {
  return page.getByRole("navigation", { name: "Areas" });
}

/** Opens the corpus from the Corpora list and one of its tabs. */
async function openCorpusTab(j: Journey, page: Page, tab: string): Promise<void> {
  await areas(page).getByRole("link", { name: "Corpora" }).click();
  await page.getByRole("link", { name: j.corpusName }).first().click();
  await page.getByRole("navigation", { name: "Corpus" }).getByRole("link", { name: tab, exact: true }).click();
}

/** Reads the invitation in the Outbox page and joins with it, in the invitee's own browser. */
async function acceptInvitation(j: Journey, role: Role): Promise<void> {
  const m = j.people[role];
  const page = await j.use(role);
  await page.goto("/dev/outbox");
  const subject = page.getByRole("button", { name: new RegExp(`invited to ${j.orgName}.*to ${m.email.replace(/[.+]/g, "\\$&")}`) });
  await subject.waitFor();
  await subject.click();
  const link = page.getByRole("article", { name: "Message" }).getByRole("link", { name: /\/invitations\// });
  const href = await link.getAttribute("href");
  check(href?.startsWith(j.options.baseUrl), `the invitation link points at the product (${href})`);
  await link.click();
  await page.getByRole("heading", { name: `Join ${j.orgName}` }).waitFor();
  await page.getByLabel("Your name").fill(m.name);
  await page.getByLabel("Password").fill(PASSWORD);
  await page.getByRole("button", { name: /Create account and join/ }).click();
  await page.waitForURL(/\/o\/[0-9a-f-]{36}$/);
}

/** One annotator's work on the note: keys for the first spans, the mouse for one more, then submit. */
async function annotateNote(j: Journey, role: Role, mouse: { from: string; to: string; type: string }, expected: string[]): Promise<void> {
  const page = await j.use(role);
  await areas(page).getByRole("link", { name: "My queue" }).click();
  await page.getByRole("heading", { name: "My queue" }).waitFor();
  await page.getByRole("link", { name: j.files.note.title, exact: true }).click();
  const text = page.getByTestId("document-text");
  await text.waitFor();
  await poll(() => text.evaluate((el) => el === document.activeElement), (v) => v, "the text has the keyboard focus");
  // Mira Quell → PERSON, Tobin Vale → PERSON, Lowmere → PLACE, with keys only (tokens in journey-data).
  await press(page, ["Shift+ArrowRight", "p", "ArrowRight", "ArrowRight", "Shift+ArrowRight", "p", "ArrowRight", "ArrowRight", "l"]);
  await dragSpan(page, mouse.from, mouse.to, mouse.type);
  const drawn = await marks(page);
  check(JSON.stringify(drawn) === JSON.stringify(expected), `${role} marked ${JSON.stringify(drawn)}, expected ${JSON.stringify(expected)}`);
  await waitSaved(page);
  await page.getByRole("button", { name: "Submit for review" }).click();
  await page.getByRole("button", { name: "Submit", exact: true }).click();
  await page.getByText("Submitted for review. It is read-only now.").waitFor();
}

/** Starts a training run from the form (with `configure` changing its settings) and waits for its tagger. */
async function train(page: Page, configure: (page: Page) => Promise<void>): Promise<void> {
  await page.getByRole("link", { name: "New training run" }).click();
  await configure(page);
  await page.getByRole("button", { name: "Start training" }).click();
  await page.getByRole("link", { name: "Open the tagger" }).waitFor({ timeout: JOB_WAIT_MS });
}

export const journeySteps: JourneyStep[] = [
  {
    name: "admin signs up",
    timeoutMs: 30_000,
    async run(j) {
      const page = await j.use("admin");
      const admin = j.people.admin;
      await page.goto("/sign-up");
      await page.getByLabel("Your name").fill(admin.name);
      await page.getByLabel("E-mail address", { exact: true }).fill(admin.email);
      await page.getByLabel("Password").fill(PASSWORD);
      await page.getByLabel("Organization name").fill(j.orgName);
      j.markSignIn();
      await page.getByRole("button", { name: "Create account" }).click();
      await page.waitForURL(/\/o\/[0-9a-f-]{36}$/);
      j.orgId = /\/o\/([0-9a-f-]{36})/.exec(page.url())![1]!;
      await page.getByRole("heading", { name: j.orgName }).waitFor();
    },
  },
  {
    name: "admin invites a manager, two annotators and a data lead",
    timeoutMs: 40_000,
    async run(j) {
      const page = await j.use("admin");
      await areas(page).getByRole("link", { name: "Members" }).click();
      for (const role of ["manager", "annotator1", "annotator2", "lead"] as const) {
        const m = j.people[role];
        await page.getByLabel("E-mail address", { exact: true }).fill(m.email);
        await page.getByLabel("Role", { exact: true }).selectOption(m.apiRole);
        await page.getByRole("button", { name: "Send invitation" }).click();
        await page.getByRole("cell", { name: m.email }).waitFor();
      }
    },
  },
  {
    name: "the manager accepts the invitation from the Outbox",
    timeoutMs: 30_000,
    async run(j) {
      await acceptInvitation(j, "manager");
      await (await j.use("manager")).getByText("You are manager here.").waitFor();
    },
  },
  {
    name: "the annotators and the data lead accept theirs",
    timeoutMs: 60_000,
    async run(j) {
      for (const role of ["annotator1", "annotator2", "lead"] as const) await acceptInvitation(j, role);
    },
  },
  {
    name: "the manager creates a corpus and its schema",
    timeoutMs: 40_000,
    async run(j) {
      const page = await j.use("manager");
      await areas(page).getByRole("link", { name: "Corpora" }).click();
      await page.getByLabel("Name", { exact: true }).fill(j.corpusName);
      await page.getByRole("button", { name: "Create corpus" }).click();
      await page.waitForURL(/\/corpora\/[0-9a-f-]{36}\/schema$/);
      j.corpusId = /\/corpora\/([0-9a-f-]{36})/.exec(page.url())![1]!;
      const types: Array<[string, string, string]> = [
        ["PERSON", "p", "A person, first and last name together."],
        ["PLACE", "l", "A named town, quay or river."],
        ["ORG", "o", "A company, line or trust."],
      ];
      for (const [name, key, guideline] of types) {
        await page.getByLabel("Name", { exact: true }).fill(name);
        await page.getByLabel("Key", { exact: true }).fill(key);
        await page.getByLabel("Guideline (Markdown)").fill(guideline);
        await page.getByRole("button", { name: "Add type" }).click();
        await page.getByRole("list", { name: "Entity types" }).getByTitle(name, { exact: true }).waitFor();
      }
    },
  },
  {
    name: "the manager uploads a .txt, a .pdf, a .docx and gold JSONL",
    timeoutMs: 60_000,
    async run(j) {
      const page = await j.use("manager");
      await page.getByRole("navigation", { name: "Corpus" }).getByRole("link", { name: "Uploads" }).click();
      await page.getByText("Documents may hold personal data.").waitFor();
      const { note, minutes, lease, gold } = j.files;
      await page.getByTestId("upload-limits").waitFor();
      // Through the "Choose files…" button and the browser's file chooser, as a person picks them.
      const [chooser] = await Promise.all([page.waitForEvent("filechooser"), page.getByRole("button", { name: "Choose files…" }).click()]);
      await chooser.setFiles([note, minutes, lease, gold].map((f) => ({ name: f.name, mimeType: "application/octet-stream", buffer: f.content })));
      await page.getByText("4 files chosen").waitFor();
      await page.getByRole("button", { name: "Upload 4 files" }).click();
      await page.getByRole("region", { name: "Upload results" }).getByText("All files read: 4 imported, 0 refused.").waitFor({ timeout: 45_000 });
      await page.getByRole("navigation", { name: "Corpus" }).getByRole("link", { name: "Documents" }).click();
      const table = page.getByRole("table", { name: "Documents" });
      for (const f of [note, minutes, lease]) await table.getByRole("link", { name: f.title, exact: true }).waitFor();
      // The PDF's text was read out of the file.
      await page.getByLabel("Search").fill("Fernhollow");
      await table.getByRole("link", { name: minutes.title, exact: true }).waitFor();
      await page.getByLabel("Search").fill("");
    },
  },
  {
    name: "the manager builds a batch for two annotators",
    timeoutMs: 30_000,
    async run(j) {
      const page = await j.use("manager");
      await areas(page).getByRole("link", { name: "Batches" }).click();
      await page.getByRole("link", { name: "New batch" }).click();
      await page.getByLabel("Batch name").fill("Quay week");
      await page.getByLabel("Due date").fill("2031-06-30");
      await page.getByLabel(`Pick ${j.files.note.title}`).check();
      await page.getByLabel(`Pick ${j.files.lease.title}`).check();
      await page.getByText("2 selected").waitFor();
      for (const role of ["annotator1", "annotator2"] as const) await page.getByRole("checkbox", { name: new RegExp(j.people[role].name) }).check();
      await page.getByLabel("Annotators per document").fill("2");
      await page.getByRole("button", { name: "Create batch and notify annotators" }).click();
      await page.getByRole("heading", { name: "Quay week" }).waitFor();
    },
  },
  {
    name: "annotator 1 marks spans with keys and the mouse and submits",
    timeoutMs: 40_000,
    async run(j) {
      await annotateNote(j, "annotator1", { from: "Corran", to: "Line", type: "ORG" }, ["PERSON:Mira Quell", "PERSON:Tobin Vale", "PLACE:Lowmere", "ORG:Corran Line"]);
    },
  },
  {
    name: "annotator 2 marks spans with keys and the mouse and submits",
    timeoutMs: 40_000,
    async run(j) {
      await annotateNote(j, "annotator2", { from: "Orla", to: "Finch", type: "PERSON" }, ["PERSON:Mira Quell", "PERSON:Tobin Vale", "PLACE:Lowmere", "PERSON:Orla Finch"]);
    },
  },
  {
    name: "the manager settles the disagreements and accepts the note as gold",
    timeoutMs: 40_000,
    async run(j) {
      const page = await j.use("manager");
      await page.reload();
      const documents = page.getByRole("table", { name: "Documents of the batch" });
      await documents.getByRole("link", { name: /Review/ }).first().click();
      await page.getByRole("heading", { name: "Disagreements (2)" }).waitFor();
      // Annotator 1 alone has ORG "Corran Line", annotator 2 alone PERSON "Orla Finch": keep both.
      const items = page.getByRole("listitem").filter({ has: page.getByRole("radio") });
      await items.filter({ hasText: "“Corran Line”" }).getByRole("radio", { name: new RegExp(`^${j.people.annotator1.name}`) }).check();
      await items.filter({ hasText: "“Orla Finch”" }).getByRole("radio", { name: new RegExp(`^${j.people.annotator2.name}`) }).check();
      await page.getByRole("button", { name: "Accept the settled result as gold (5 spans)" }).click();
      await documents.getByText("Gold", { exact: true }).waitFor();
    },
  },
  {
    name: "the data lead trains two taggers with different settings",
    timeoutMs: 2 * JOB_WAIT_MS + 20_000,
    async run(j) {
      const page = await j.use("lead");
      await openCorpusTab(j, page, "Training");
      await page.getByText("No training runs yet").waitFor();
      // Run 1: the engine's defaults.
      await train(page, async () => undefined);
      await page.getByRole("link", { name: "← Training" }).click();
      // Run 2: plain counts (no word classes, suffixes or previous-word context, no cross-validation).
      await train(page, async (p) => {
        await p.getByLabel("Word classes").selectOption("none");
        await p.getByLabel("Suffix length").fill("0");
        await p.getByRole("checkbox", { name: /Previous-word conditioning/ }).uncheck();
        await p.getByRole("checkbox", { name: /Cross-validate/ }).uncheck();
      });
      await page.getByRole("link", { name: "← Training" }).click();
      const runs = page.getByRole("table", { name: "Training runs" });
      await poll(() => runs.getByText("Finished").count(), (n) => n === 2, "finished runs");
    },
  },
  {
    name: "the data lead compares the two taggers",
    timeoutMs: 40_000,
    async run(j) {
      const page = await j.use("lead");
      await page.getByRole("table", { name: "Taggers" }).getByRole("link", { name: new RegExp(`Tagger v1 of ${j.corpusName}`) }).click();
      await page.getByRole("heading", { name: `Tagger v1 of ${j.corpusName}` }).waitFor();
      const picker = page.getByLabel("Compare with");
      const label = await picker.locator("option").filter({ hasText: `Tagger v2 of ${j.corpusName}` }).textContent();
      check(label, "tagger v2 is offered for comparison");
      await picker.selectOption({ label });
      await page.getByRole("button", { name: "Compare", exact: true }).click();
      await page.getByRole("heading", { name: new RegExp(`A: Tagger v1 of ${j.corpusName} · B: Tagger v2 of ${j.corpusName}`) }).waitFor();
      await page.getByText(/^F1 difference \(B − A\)/).waitFor();
    },
  },
  {
    name: "the data lead makes tagger v1 the suggester",
    timeoutMs: JOB_WAIT_MS + 20_000,
    async run(j) {
      const page = await j.use("lead");
      await openCorpusTab(j, page, "Suggester");
      await page.getByText("No tagger suggests for this corpus yet.").waitFor();
      const picker = page.getByLabel("Tagger that suggests");
      const label = await picker.locator("option").filter({ hasText: `Tagger v1 of ${j.corpusName}` }).textContent();
      check(label, "tagger v1 is offered as suggester");
      await picker.selectOption({ label });
      await page.getByRole("button", { name: "Use this suggester" }).click();
      await page.getByTestId("suggester-current").getByText(/\(version 1\) pre-annotates documents without gold/).waitFor();
      // Every document without gold: the .pdf and the .docx.
      await page.getByText(/^Tagged 2 of 2 documents/).waitFor({ timeout: JOB_WAIT_MS });
    },
  },
  {
    name: "annotator 1 sees the suggestions and accepts one",
    timeoutMs: 40_000,
    async run(j) {
      const page = await j.use("annotator1");
      await areas(page).getByRole("link", { name: "My queue" }).click();
      await page.getByRole("heading", { name: "My queue" }).waitFor();
      await page.getByRole("link", { name: j.files.lease.title, exact: true }).click();
      await page.getByTestId("document-text").waitFor();
      const panel = page.getByRole("region", { name: /Suggestions/ });
      const items = panel.getByRole("listitem");
      await items.first().waitFor();
      j.markSuggestionSeen();
      const before = await items.count();
      check(before > 0, "the suggester left suggestions on the lease");
      const label = ((await items.first().getByRole("button").first().textContent()) ?? "").replace(/\s+\S+ · \d+%$/, "").trim();
      await items.first().getByRole("button", { name: "Accept", exact: true }).click();
      await poll(() => items.count(), (n) => n === before - 1, "suggestions left to decide");
      const drawn = await marks(page);
      check(drawn.some((m) => m.endsWith(`:${label}`)), `the accepted suggestion "${label}" is drawn as a span (${JSON.stringify(drawn)})`);
      await waitSaved(page);
    },
  },
  {
    name: "the admin buys a seat on the checkout page and invites one more member",
    timeoutMs: 50_000,
    async run(j) {
      const page = await j.use("admin");
      await areas(page).getByRole("link", { name: "Billing" }).click();
      // The free plan's five seats are the admin and the four who joined.
      await page.getByText("5 used of 5 free").waitFor();
      await page.getByRole("heading", { name: "Buy seats" }).waitFor();
      await page.getByLabel("Seats").fill("6");
      await page.getByRole("button", { name: "Continue to payment" }).click();
      await page.waitForURL(/\/pay\/cs_test_/);
      await page.getByText("LOCAL TEST PAYMENT PAGE").waitFor();
      await page.getByRole("button", { name: /^Pay .* \(test\)$/ }).click();
      await page.waitForURL(/\/billing\?checkout=returned$/);
      // The seats change once the signed webhook has been handled.
      await page.getByText("5 used of 6 paid").waitFor();
      await areas(page).getByRole("link", { name: "Members" }).click();
      const email = `newcomer-${j.options.stamp}@example.test`;
      await page.getByLabel("E-mail address", { exact: true }).fill(email);
      await page.getByLabel("Role", { exact: true }).selectOption("annotator");
      await page.getByRole("button", { name: "Send invitation" }).click();
      await page.getByRole("cell", { name: email }).waitFor();
    },
  },
  {
    name: "the data lead creates an API token",
    timeoutMs: 30_000,
    async run(j) {
      const page = await j.use("lead");
      await areas(page).getByRole("link", { name: "API tokens" }).click();
      await page.getByLabel("Token name").fill("Quay pipeline");
      await page.getByRole("button", { name: "Create token" }).click();
      const secret = (await page.getByTestId("new-token").textContent())?.trim() ?? "";
      check(/^tgl_\S{43}$/.test(secret), `the new token's secret is shown once (${secret.slice(0, 8)}…)`);
      j.apiToken = secret;
      await page.getByRole("button", { name: "I have stored it" }).click();
    },
  },
  {
    name: "the token tags a text through the API",
    timeoutMs: 20_000,
    async run(j) {
      const started = Date.now();
      const res = await fetch(`${j.options.baseUrl}/api/v1/corpora/${j.corpusId}/tag`, {
        method: "POST",
        headers: { Authorization: `Bearer ${j.apiToken}`, "Content-Type": "application/json" },
        body: JSON.stringify({ text: API_TEXT }),
        signal: AbortSignal.timeout(15_000),
      });
      const body = await res.text();
      check(res.status === 200, `the tagging API answered ${res.status}: ${body}`);
      const parsed = JSON.parse(body) as { tagger: { version: number }; results: Array<{ spans: Array<{ start: number; end: number; type: string; text: string }> }> };
      check(parsed.tagger.version === 1, `tagger v1 (the suggester) answered, not v${parsed.tagger.version}`);
      const spans = parsed.results[0]?.spans ?? [];
      check(spans.length > 0, "the suggester found entities in the text");
      for (const s of spans) check(API_TEXT.slice(s.start, s.end) === s.text, `span ${JSON.stringify(s)} matches the text`);
      check(spans.some((s) => s.text === "Brackenfold Ltd" && s.type === "ORG"), `"Brackenfold Ltd" is an ORG (${JSON.stringify(spans)})`);
      j.recordFetch(started, "POST /api/v1/corpora/:id/tag");
    },
  },
];

/** The timings as a fixed-width table, with the sign-in-to-suggestion figure below it. */
export function formatTimings(j: Pick<Journey, "timings" | "signInToSuggestionMs">): string {
  const rows = j.timings.map((t, i) => [String(i + 1), t.name, (t.browserMs / 1000).toFixed(2), (t.apiMs / 1000).toFixed(2), String(t.apiRequests), `${(t.slowestMs / 1000).toFixed(2)} ${t.slowest}`]);
  const total = j.timings.reduce((a, t) => ({ b: a.b + t.browserMs, api: a.api + t.apiMs, n: a.n + t.apiRequests }), { b: 0, api: 0, n: 0 });
  rows.push(["", "all steps", (total.b / 1000).toFixed(2), (total.api / 1000).toFixed(2), String(total.n), ""]);
  const head = ["#", "step", "browser s", "API s", "requests", "slowest request (s)"];
  const widths = head.map((h, c) => Math.max(h.length, ...rows.map((r) => r[c]!.length)));
  const line = (r: string[]) => r.map((cell, c) => (c >= 2 && c <= 4 ? cell.padStart(widths[c]!) : cell.padEnd(widths[c]!))).join("  ").trimEnd();
  const out = [line(head), widths.map((w) => "-".repeat(w)).join("  "), ...rows.map(line)];
  out.push("", `sign-in to first suggestion seen: ${j.signInToSuggestionMs === null ? "not reached" : `${(j.signInToSuggestionMs / 1000).toFixed(2)} s`}`);
  return out.join("\n");
}
