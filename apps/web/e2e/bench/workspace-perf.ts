// Workspace speed in Chromium (a script, never part of the test run): opens a 50,000-token
// document with 4,000 suggestions in the built app, then times keystrokes that add a span.
// Targets: the text renders in under 1 s; a keystroke that adds a span costs under 16 ms of
// scripting (the key handler plus React's render and commit, measured with performance.now()
// around a dispatched keydown in the page).
// Run: cd apps/web && npx vite build && npx tsx e2e/bench/workspace-perf.ts
import { chromium } from "playwright-core";
import { setUpTeam, signIn } from "../support/annotation-team";
import { startProduct } from "../support/product";

const TOKENS = 50_000;
const RENDER_TARGET_MS = 1000;
const KEY_TARGET_MS = 16;

// Invented sentences of 12 tokens each, five to a paragraph, with a name in every one.
function longDocument(): { text: string; names: Array<{ start: number; end: number }> } {
  const first = ["Mira", "Tobin", "Orla", "Edda", "Jory", "Ines", "Hale", "Wren"];
  const last = ["Quell", "Vale", "Finch", "Rusk", "Marrow", "Ashby", "Thorne"];
  const parts: string[] = [];
  const names: Array<{ start: number; end: number }> = [];
  let length = 0;
  const sentences = Math.ceil(TOKENS / 12);
  for (let i = 0; i < sentences; i++) {
    const name = `${first[i % first.length]} ${last[(i * 3) % last.length]}`;
    const sentence = `On day ${i + 1} ${name} checked the depot ledger and signed it.`;
    const sep = i === 0 ? "" : i % 5 === 0 ? "\n\n" : " ";
    names.push({ start: length + sep.length + sentence.indexOf(name), end: length + sep.length + sentence.indexOf(name) + name.length });
    parts.push(sep + sentence);
    length += sep.length + sentence.length;
  }
  return { text: parts.join(""), names };
}

const product = await startProduct();
let failed = false;
try {
  const team = await setUpTeam(product.baseUrl, product.mailUrl, `perf${Date.now().toString(36)}`);
  const { text, names } = longDocument();
  const form = new FormData();
  form.append("spanMode", "suggested");
  const line = { title: "Long ledger", text, spans: names.slice(0, 4000).map((n, i) => ({ ...n, type: "PERSON", confidence: 0.5 + (i % 50) / 100 })) };
  form.append("files", new Blob([JSON.stringify(line)], { type: "application/json" }), "long.jsonl");
  await team.api.call("POST", `/orgs/${team.orgId}/corpora/${team.corpusId}/uploads`, undefined, form);
  let docId: string | undefined;
  let tokenCount = 0;
  for (let i = 0; i < 240 && !docId; i++) {
    const page = await team.api.call<{ items: Array<{ id: string; title: string; tokenCount: number }> }>("GET", `/orgs/${team.orgId}/corpora/${team.corpusId}/documents`);
    const hit = page.items.find((d) => d.title === "Long ledger");
    if (hit) [docId, tokenCount] = [hit.id, hit.tokenCount];
    else await new Promise((r) => setTimeout(r, 250));
  }
  if (!docId) throw new Error("the long document did not appear");
  await team.api.call("POST", `/orgs/${team.orgId}/corpora/${team.corpusId}/batches`, {
    name: "Perf",
    documentIds: [docId],
    assignment: { mode: "round_robin", annotatorIds: [team.annotators[0].userId], annotatorsPerDocument: 1 },
  });
  const browser = await chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium", args: ["--no-sandbox", "--disable-gpu", "--disable-dev-shm-usage"] });
  const page = await (await browser.newContext({ baseURL: product.baseUrl, viewport: { width: 1400, height: 900 } })).newPage();
  await signIn(page, team.annotators[0], `/o/${team.orgId}/queue`);
  const href = (await page.getByRole("link", { name: "Long ledger", exact: true }).getAttribute("href"))!;

  const opens: Array<{ total: number; render: number }> = [];
  for (let run = 0; run < 3; run++) {
    await page.goto(href);
    await page.locator("[data-testid=document-text] [data-t]").first().waitFor();
    await page.waitForFunction(() => performance.getEntriesByName("tagloom:text-painted").length > 0);
    opens.push(
      (await page.evaluate(`(() => {
        const painted = performance.getEntriesByName("tagloom:text-painted")[0].startTime;
        const api = performance.getEntriesByType("resource").filter((e) => /\\/assignments\\/[0-9a-f-]+$/.test(e.name));
        const fetched = api[api.length - 1].responseEnd;
        return { total: painted, render: painted - fetched };
      })()`)) as { total: number; render: number },
    );
  }
  const domTokens = await page.locator("[data-testid=document-text] [data-t]").count();

  // Keystrokes that add a span: move to a fresh word (not timed), then time the "p" key.
  // Written as a string: the bundler that runs this script would otherwise wrap the page code in
  // helpers that do not exist in the page.
  const keys = (await page.evaluate(`(async () => {
    const el = document.querySelector("[data-testid=document-text]");
    el.focus();
    const press = (key, code) => el.dispatchEvent(new KeyboardEvent("keydown", { key, code, bubbles: true, cancelable: true }));
    const settle = () => new Promise((r) => requestAnimationFrame(() => setTimeout(r, 0)));
    const scripting = [];
    const withLayout = [];
    for (let i = 0; i < 30; i++) {
      for (let k = 0; k < 3; k++) press("ArrowRight", "ArrowRight");
      await settle();
      const before = document.querySelectorAll("mark[data-span]").length;
      const t0 = performance.now();
      press("p", "KeyP");
      await Promise.resolve();
      const t1 = performance.now();
      void el.offsetHeight;
      const t2 = performance.now();
      if (document.querySelectorAll("mark[data-span]").length !== before + 1) throw new Error("keystroke " + i + " did not add a span");
      scripting.push(t1 - t0);
      withLayout.push(t2 - t0);
      await settle();
    }
    return { scripting, withLayout };
  })()`)) as { scripting: number[]; withLayout: number[] };
  await browser.close();

  const sorted = (xs: number[]) => [...xs].sort((a, b) => a - b);
  const median = (xs: number[]) => sorted(xs)[Math.floor(xs.length / 2)]!;
  const p95 = (xs: number[]) => sorted(xs)[Math.ceil(xs.length * 0.95) - 1]!;
  const worstOpen = Math.max(...opens.map((o) => o.render));
  console.log(`document: ${tokenCount.toLocaleString("en")} tokens, ${names.length} names, 4,000 suggestions; ${domTokens} token elements in the page`);
  for (const [i, o] of opens.entries()) console.log(`open ${i + 1}: text painted ${o.total.toFixed(0)} ms after navigation, ${o.render.toFixed(0)} ms after the document arrived`);
  console.log(`keystroke adding a span (30 runs): scripting median ${median(keys.scripting).toFixed(2)} ms, p95 ${p95(keys.scripting).toFixed(2)} ms, max ${Math.max(...keys.scripting).toFixed(2)} ms`);
  console.log(`  with style and layout: median ${median(keys.withLayout).toFixed(2)} ms, p95 ${p95(keys.withLayout).toFixed(2)} ms`);
  const ok = tokenCount >= TOKENS && worstOpen < RENDER_TARGET_MS && p95(keys.scripting) < KEY_TARGET_MS;
  console.log(ok ? `PASS: render < ${RENDER_TARGET_MS} ms, keystroke scripting < ${KEY_TARGET_MS} ms` : `FAIL: targets render < ${RENDER_TARGET_MS} ms, keystroke < ${KEY_TARGET_MS} ms`);
  failed = !ok;
} finally {
  await product.stop();
}
process.exitCode = failed ? 1 : 0;
