import fs from "node:fs";
import path from "node:path";
import { type Browser, chromium } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Journey, formatTimings, journeySteps } from "./support/journey-steps";
import { type Product, startProduct } from "./support/product";

// The whole job in one ordered walk through the UI alone, on a product of its own (the shared
// one's worker may still be busy with other files' jobs): sign-up, invitations read from the Outbox, a corpus with a schema and
// three kinds of file, a batch for two annotators, review, two taggers compared, the suggester,
// a suggestion accepted, a seat bought on the payments fake, an API token that tags a text.
// Each step fails on any console error, page error, failed request or 5xx; every wait is bounded;
// a screenshot per step lands in e2e/artifacts/full-journey/ (not committed).
const ARGS = ["--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync", "--disable-dev-shm-usage"];

let product: Product;
let browser: Browser;
let journey: Journey;

const artifactsDir = path.resolve(import.meta.dirname, "artifacts/full-journey");

beforeAll(async () => {
  fs.rmSync(artifactsDir, { recursive: true, force: true });
  product = await startProduct();
  browser = await chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium", headless: true, args: ARGS });
  journey = new Journey({
    browser,
    baseUrl: product.baseUrl,
    mailUrl: product.mailUrl,
    logTail: () => product.logTail(),
    artifactsDir,
    stamp: `j${Date.now().toString(36)}`,
  });
});

afterAll(async () => {
  if (journey?.timings.length) console.log(`full journey timings\n${formatTimings(journey)}`);
  await journey?.close();
  await browser?.close();
  await product?.stop();
});

describe("the whole job in one browser journey", () => {
  for (const step of journeySteps) it(step.name, () => journey.run(step), step.timeoutMs + 5_000);

  it("reached the first suggestion and timed every step", () => {
    expect(journey.timings.map((t) => t.name)).toEqual(journeySteps.map((s) => s.name));
    expect(journey.signInToSuggestionMs).toBeGreaterThan(0);
  });
});
