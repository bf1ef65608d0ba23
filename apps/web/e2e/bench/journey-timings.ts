// Timings of the full browser journey (a script, never part of the test run): starts a private
// product, walks the same steps as e2e/full-journey.test.ts in Chromium several times on fresh
// organizations, and prints per step the median browser time (wall clock), the median API time
// (time with at least one /api request in flight, from the browser's resource timing), the API
// share of the step, and the time from the admin's sign-in to the first suggestion an annotator
// sees. Only a failed step is screenshotted (in e2e/artifacts/journey-bench/), so none of it counts.
// Run: npm run bench -- web   (or: cd apps/web && npx vite build && npx tsx e2e/bench/journey-timings.ts [--runs N])
import path from "node:path";
import { chromium } from "playwright-core";
import { Journey, type StepTiming, formatTimings, journeySteps } from "../support/journey-steps";
import { startProduct } from "../support/product";

const runsArg = process.argv.indexOf("--runs");
const RUNS = runsArg > 0 ? Number(process.argv[runsArg + 1]) : 3;
if (!Number.isInteger(RUNS) || RUNS < 1 || RUNS > 20) {
  console.error("--runs takes a whole number from 1 to 20");
  process.exit(2);
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const mid = Math.floor(s.length / 2);
  return s.length % 2 ? s[mid]! : (s[mid - 1]! + s[mid]!) / 2;
}

const product = await startProduct();
const browser = await chromium.launch({
  executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
  headless: true,
  args: ["--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync", "--disable-dev-shm-usage"],
});
let failed = false;
const runs: Array<{ timings: StepTiming[]; signInToSuggestionMs: number }> = [];
try {
  for (let r = 0; r < RUNS; r++) {
    const journey = new Journey({ browser, baseUrl: product.baseUrl, mailUrl: product.mailUrl, artifactsDir: path.resolve(import.meta.dirname, "../artifacts/journey-bench"), screenshotFailuresOnly: true, stamp: `b${r}${Date.now().toString(36)}` });
    try {
      for (const step of journeySteps) await journey.run(step);
    } finally {
      await journey.close();
    }
    if (journey.signInToSuggestionMs === null) throw new Error("the journey never reached a suggestion");
    runs.push({ timings: journey.timings, signInToSuggestionMs: journey.signInToSuggestionMs });
    console.log(`run ${r + 1} of ${RUNS}: ${(journey.timings.reduce((a, t) => a + t.browserMs, 0) / 1000).toFixed(1)} s in the browser`);
  }
  const steps: StepTiming[] = journeySteps.map((s, i) => {
    const of = runs.map((run) => run.timings[i]!);
    const slowest = of.reduce((a, t) => (t.slowestMs > a.slowestMs ? t : a));
    return {
      name: s.name,
      browserMs: median(of.map((t) => t.browserMs)),
      apiMs: median(of.map((t) => t.apiMs)),
      apiRequests: Math.round(median(of.map((t) => t.apiRequests))),
      slowestMs: slowest.slowestMs,
      slowest: slowest.slowest,
    };
  });
  const toSuggestion = runs.map((r) => r.signInToSuggestionMs);
  console.log(`\nFull journey, median of ${RUNS} run${RUNS === 1 ? "" : "s"} on ${new Date().toISOString().slice(0, 10)} (slowest request: the worst over the runs)\n`);
  console.log(formatTimings({ timings: steps, signInToSuggestionMs: median(toSuggestion) }));
  const browserTotal = steps.reduce((a, t) => a + t.browserMs, 0);
  const apiTotal = steps.reduce((a, t) => a + t.apiMs, 0);
  console.log(`sign-in to first suggestion over the runs: min ${(Math.min(...toSuggestion) / 1000).toFixed(2)} s, max ${(Math.max(...toSuggestion) / 1000).toFixed(2)} s`);
  console.log(`API share of the browser time: ${((apiTotal / browserTotal) * 100).toFixed(0)}% (the rest is rendering, typing and waiting for the worker's jobs)`);
} catch (err) {
  failed = true;
  console.error(err);
} finally {
  await browser.close();
  await product.stop();
}
process.exit(failed ? 1 : 0);
