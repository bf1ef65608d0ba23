// The suggestion job over about 1,000,000 tokens of open documents (5,000 invented documents of
// ~200 tokens, no gold): from the data lead's PUT of the suggester until every shard is stored,
// with one worker process and then with two (a fresh tagger version, so that all documents are
// tagged again). The API and the workers run as their own processes against a throwaway
// PostgreSQL on 127.0.0.1. Target (issue 10): under 60 s with one worker; report the ratio.
//
// Run: cd apps/api && npx tsx bench/suggest.ts [documents=5000] [tokensPerDocument=200] [workerCounts=1,2]
import { type ChildProcess, spawn } from "node:child_process";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { benchModelText } from "./support/bench-tagger";
import { startBenchProduct, stopChildren } from "./support/bench-product";
import { seedDocuments } from "./support/seed-documents";

const DOCUMENTS = Number(process.argv[2] ?? 5000);
const TOKENS = Number(process.argv[3] ?? 200);
const COUNTS = (process.argv[4] ?? "1,2").split(",").map(Number);
const TARGET_SECONDS = 60;
const apiDir = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");

const product = await startBenchProduct("bench-suggest");
const workers: ChildProcess[] = [];
try {
  const { db } = await import("../src/db/knex");
  const { insertTagger } = await import("../src/training/taggers.service");
  const { call } = product;
  const corpusId = (await call("POST", "/corpora", { name: "Suggestion bench" })).id as string;
  await call("POST", `/corpora/${corpusId}/entity-types`, { name: "PARTY" });
  await seedDocuments(db, { organizationId: product.orgId, corpusId, count: DOCUMENTS, tokens: TOKENS });
  const { n: tokenCount } = (await db("documents").where({ corpus_id: corpusId }).sum({ n: "token_count" }).first()) as { n: number };
  const text = benchModelText(TOKENS);
  console.log(`seeded ${DOCUMENTS} open documents, ${tokenCount} tokens; tagger model ${(text.length / 1024).toFixed(0)} KiB`);

  const results: Array<{ workers: number; seconds: number; tokensPerSecond: number; spans: number }> = [];
  for (const count of COUNTS) {
    for (let i = 0; i < count; i++) {
      workers.push(spawn(process.execPath, ["--import", "tsx", "src/worker.ts"], { cwd: apiDir, env: { ...process.env }, stdio: ["ignore", "inherit", "inherit"] }));
    }
    // Give the workers a moment to create their queues and start polling.
    await new Promise((r) => setTimeout(r, 4000));
    const tagger = await insertTagger({ organizationId: product.orgId, corpusId, modelText: text });
    const t0 = performance.now();
    await call("PUT", `/corpora/${corpusId}/suggester`, { taggerId: tagger.id });
    let spans = 0;
    for (;;) {
      const status = await call("GET", `/corpora/${corpusId}/suggester`);
      const run = (status.runs as Array<{ finishedAt: string | null; spansSuggested: number; documentsDone: number }>)[0]!;
      if (run.finishedAt) {
        spans = run.spansSuggested;
        break;
      }
      if (performance.now() - t0 > 600_000) throw new Error(`suggestion run unfinished after 600 s: ${run.documentsDone} documents`);
      await new Promise((r) => setTimeout(r, 200));
    }
    const seconds = (performance.now() - t0) / 1000;
    results.push({ workers: count, seconds, tokensPerSecond: Math.round(tokenCount / seconds), spans });
    console.log(`${count} worker${count > 1 ? "s" : ""}: ${seconds.toFixed(1)} s (${Math.round(tokenCount / seconds)} tokens/s), ${spans} spans suggested`);
    await stopChildren(workers.splice(0));
  }
  const one = results.find((r) => r.workers === 1);
  const two = results.find((r) => r.workers === 2);
  console.log(
    JSON.stringify({
      bench: "suggest",
      documents: DOCUMENTS,
      tokens: tokenCount,
      results,
      speedupTwoWorkers: one && two ? Number((one.seconds / two.seconds).toFixed(2)) : null,
      targetSeconds: TARGET_SECONDS,
      withinTarget: one ? one.seconds < TARGET_SECONDS : null,
    }),
  );
} finally {
  await stopChildren(workers);
  await product.stop();
}
