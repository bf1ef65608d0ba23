// Training runs end to end through the queue: the API and worker processes against a throwaway
// PostgreSQL. (1) A run on ~200,000 gold tokens with 4 entity types (load from PostgreSQL, count,
// smooth, evaluate on the test split with the learning curve, store) with one worker, then the
// same run with two worker processes (target, issue 9: under 30 s with one worker; report the
// ratio). (2) A run over ~2,000,000 gold tokens, sampling the API's and the workers' resident
// memory every 100 ms (target: peak under 500 MB each; gold streams from a cursor).
//
// Run: cd apps/api && npx tsx bench/training.ts [smallTokens=200000] [largeTokens=2000000]
import { type ChildProcess, spawn } from "node:child_process";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { type BenchProduct, rssMb, startBenchProduct, stopChildren } from "./support/bench-product";

const SMALL = Number(process.argv[2] ?? 200_000);
const LARGE = Number(process.argv[3] ?? 2_000_000);
const apiDir = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
// About 10 tokens per sentence and 10 sentences per document in the generated memos.
const TOKENS_PER_DOCUMENT = 100;

function startWorker(): ChildProcess {
  return spawn(process.execPath, ["--import", "tsx", "src/worker.ts"], { cwd: apiDir, env: { ...process.env, LOG_LEVEL: "warn" }, stdio: ["ignore", "inherit", "inherit"] });
}

async function call(product: BenchProduct, method: string, p: string, body?: object): Promise<Record<string, unknown>> {
  const res = await fetch(`${product.base}/api/orgs/${product.orgId}${p}`, {
    method,
    headers: { ...product.headers, "Content-Type": "application/json" },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const json = (await res.json()) as Record<string, unknown>;
  if (res.status >= 400) throw new Error(`${method} ${p}: ${res.status} ${JSON.stringify(json)}`);
  return json;
}

async function seedCorpus(product: BenchProduct, name: string, tokens: number): Promise<{ corpusId: string; goldTokens: number }> {
  const { createTrainingCorpus, generateDocuments } = await import("../test/support/training-data");
  const { db } = await import("../src/db/knex");
  const count = Math.ceil(tokens / TOKENS_PER_DOCUMENT);
  const t0 = performance.now();
  const { corpusId } = await createTrainingCorpus(product.orgId, { userId: product.userId, email: product.email }, name, generateDocuments(count, 10, 7));
  const r = await db("documents").where({ corpus_id: corpusId }).sum<{ n: number }[]>({ n: "token_count" });
  const goldTokens = Number(r[0]!.n);
  console.log(`seeded ${count} gold documents, ${goldTokens} tokens, in ${((performance.now() - t0) / 1000).toFixed(1)} s`);
  return { corpusId, goldTokens };
}

/** Starts a run and waits for it; returns seconds from the POST to the stored tagger. */
async function timeRun(product: BenchProduct, corpusId: string, body: object, sample?: () => void): Promise<{ seconds: number; run: Record<string, unknown> }> {
  const t0 = performance.now();
  const started = await call(product, "POST", `/corpora/${corpusId}/runs`, body);
  for (;;) {
    sample?.();
    const run = await call(product, "GET", `/corpora/${corpusId}/runs/${started.id}`);
    if (run.status === "succeeded") return { seconds: (performance.now() - t0) / 1000, run };
    if (run.status === "failed" || run.status === "cancelled") throw new Error(`run ${run.status}: ${run.error}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

const product = await startBenchProduct("bench-training");
const workers: ChildProcess[] = [];
try {
  const config = { crossValidationFolds: null };
  const small = await seedCorpus(product, "Training bench", SMALL);
  workers.push(startWorker());
  // A first short run warms the worker (module loading, pg-boss queues) so that the timed runs
  // measure training, not start-up.
  await timeRun(product, small.corpusId, { ...config, testSplit: { kind: "holdout", percent: 20 } });
  const one = await timeRun(product, small.corpusId, config);
  const f1 = (one.run.evaluation as { overall: { f1: number } }).overall.f1;
  console.log(`1 worker: ${small.goldTokens} gold tokens, 4 types, ${one.run.shardCount} shards: ${one.seconds.toFixed(2)} s end to end (target < 30 s); test F1 ${f1.toFixed(4)}`);
  workers.push(startWorker());
  await new Promise((r) => setTimeout(r, 3000));
  const two = await timeRun(product, small.corpusId, config);
  console.log(`2 workers: ${two.seconds.toFixed(2)} s; ratio 2 workers / 1 worker = ${(two.seconds / one.seconds).toFixed(2)}`);

  const large = await seedCorpus(product, "Training bench large", LARGE);
  await stopChildren(workers.splice(1));
  const pids = { api: product.api.pid!, worker: workers[0]!.pid! };
  const peak = { api: rssMb(pids.api), worker: rssMb(pids.worker) };
  const sampler = setInterval(() => {
    peak.api = Math.max(peak.api, rssMb(pids.api));
    peak.worker = Math.max(peak.worker, rssMb(pids.worker));
  }, 100);
  const big = await timeRun(product, large.corpusId, config);
  clearInterval(sampler);
  console.log(
    `large run: ${large.goldTokens} gold tokens, ${big.run.shardCount} shards, 1 worker: ${big.seconds.toFixed(1)} s; peak RSS API ${peak.api.toFixed(0)} MB, worker ${peak.worker.toFixed(0)} MB (target < 500 MB)`,
  );
} finally {
  await stopChildren(workers);
  await product.stop();
  const { db } = await import("../src/db/knex");
  await db.destroy();
}
