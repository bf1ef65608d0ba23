// Takes the README's screenshots from a running demo (npm start), 1440 px wide, with Debian's
// Chromium:   node docs/screenshots/take.mjs [base URL, default http://127.0.0.1:8080]
import { createRequire } from "node:module";
import path from "node:path";
import { fileURLToPath } from "node:url";

const here = path.dirname(fileURLToPath(import.meta.url));
const { chromium } = createRequire(path.join(here, "../../apps/web/package.json"))("playwright-core");
const base = process.argv[2] ?? "http://127.0.0.1:8080";
const PASSWORD = "demo-password-1";

const browser = await chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium", headless: true, args: ["--no-sandbox", "--disable-gpu", "--disable-dev-shm-usage"] });

async function as(email) {
  const context = await browser.newContext({ baseURL: base, viewport: { width: 1440, height: 900 } });
  const page = await context.newPage();
  await page.goto("/sign-in");
  await page.getByLabel("E-mail address").fill(email);
  await page.getByLabel("Password").fill(PASSWORD);
  await page.getByRole("button", { name: /sign in/i }).click();
  await page.waitForURL((u) => !u.pathname.startsWith("/sign-in"));
  await page.waitForURL(/\/o\/[0-9a-f-]{36}/);
  const orgId = /\/o\/([0-9a-f-]{36})/.exec(page.url())[1];
  const corpora = await page.evaluate(async (o) => (await (await fetch(`/api/orgs/${o}/corpora`)).json()), orgId);
  const corpusId = (Array.isArray(corpora) ? corpora : corpora.items)[0].id;
  return { page, orgId, corpusId, close: () => context.close() };
}

async function shot(page, name) {
  await page.waitForLoadState("networkidle");
  await page.waitForTimeout(400);
  await page.screenshot({ path: path.join(here, `${name}.png`) });
  console.log(`saved docs/screenshots/${name}.png`);
}

const only = process.env.SHOTS ? process.env.SHOTS.split(",") : null;
const want = (n) => !only || only.includes(n);

{
  const { page, orgId, close } = await as("admin@demo.tagloom.test");
  if (want("admin-members")) { await page.goto(`/o/${orgId}/members`); await shot(page, "admin-members"); }
  if (want("admin-billing")) { await page.goto(`/o/${orgId}/billing`); await shot(page, "admin-billing"); }
  await close();
}
{
  const { page, orgId, corpusId, close } = await as("manager@demo.tagloom.test");
  if (want("manager-review")) {
    await page.goto(`/o/${orgId}/batches`);
    await page.getByRole("link", { name: "Second look: spring orders" }).first().click();
    await page.getByRole("table", { name: "Documents of the batch" }).getByRole("link", { name: /Review/ }).first().click();
    await shot(page, "manager-review");
  }
  if (want("manager-corpus")) { await page.goto(`/o/${orgId}/corpora/${corpusId}`); await shot(page, "manager-corpus"); }
  await close();
}
{
  const { page, orgId, corpusId, close } = await as("lead@demo.tagloom.test");
  const taggers = (await page.evaluate(async (u) => (await (await fetch(u)).json()), `/api/orgs/${orgId}/corpora/${corpusId}/taggers`)).items;
  const [a, b] = [...taggers].sort((x, y) => y.version - x.version);
  const training = `/o/${orgId}/corpora/${corpusId}/training`;
  if (want("lead-training")) { await page.goto(training); await shot(page, "lead-training"); }
  if (want("lead-tagger")) { await page.goto(`${training}/taggers/${b.id}`); await shot(page, "lead-tagger"); }
  if (want("lead-compare")) { await page.goto(`${training}/taggers/${b.id}/compare/${a.id}`); await shot(page, "lead-compare"); }
  if (want("lead-suggester")) { await page.goto(`/o/${orgId}/corpora/${corpusId}/suggester`); await shot(page, "lead-suggester"); }
  if (want("lead-uncertain")) { await page.goto(`/o/${orgId}/corpora/${corpusId}/uncertain`); await shot(page, "lead-uncertain"); }
  await close();
}
{
  const { page, orgId, close } = await as("annotator3@demo.tagloom.test");
  if (want("annotator-queue")) { await page.goto(`/o/${orgId}/queue`); await shot(page, "annotator-queue"); }
  if (want("annotator-workspace")) {
    await page.goto(`/o/${orgId}/queue`);
    await page.getByRole("link", { name: /^Start next/ }).first().click();
    await page.getByRole("button", { name: "Submit for review" }).waitFor();
    await shot(page, "annotator-workspace");
  }
  await close();
}
await browser.close();
