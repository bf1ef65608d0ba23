// Exporting 100,000 gold documents through HTTP as JSONL and as CoNLL, reading the response as it
// streams and sampling the API's resident memory every 100 ms. A streamed export holds a few
// documents at a time, so the API's memory should stay flat (no growth with the corpus size)
// while the whole file goes by. Target (issue 5): constant memory.
//
// Run: cd apps/api && npx tsx bench/export.ts [documents=100000] [tokensPerDocument=120]
import { rssMb, startBenchProduct } from "./support/bench-product";
import { seedDocuments } from "./support/seed-documents";

const DOCUMENTS = Number(process.argv[2] ?? 100_000);
const TOKENS = Number(process.argv[3] ?? 120);

const product = await startBenchProduct("bench-export");
try {
  const { db } = await import("../src/db/knex");
  const post = async (path: string, body: object) => {
    const res = await fetch(`${product.base}/api/orgs/${product.orgId}${path}`, {
      method: "POST",
      headers: { ...product.headers, "Content-Type": "application/json" },
      body: JSON.stringify(body),
    });
    return (await res.json()) as { id: string };
  };
  const corpusId = (await post("/corpora", { name: "Export bench" })).id;
  const typeId = (await post(`/corpora/${corpusId}/entity-types`, { name: "PARTY" })).id;
  const seedStart = performance.now();
  await seedDocuments(db, { organizationId: product.orgId, corpusId, count: DOCUMENTS, tokens: TOKENS, goldTypeId: typeId, userId: product.userId }, (n) => {
    if (n % 20_000 === 0) console.log(`seeded ${n} documents`);
  });
  console.log(`seeded ${DOCUMENTS} gold documents of ~${TOKENS} tokens in ${((performance.now() - seedStart) / 1000).toFixed(1)} s`);

  for (const format of ["jsonl", "conll"] as const) {
    const pid = product.api.pid!;
    const before = rssMb(pid);
    const samples: Array<{ atMb: number; rss: number }> = [];
    let received = 0;
    const sampler = setInterval(() => samples.push({ atMb: received / 1048576, rss: rssMb(pid) }), 100);
    const t0 = performance.now();
    const res = await fetch(`${product.base}/api/orgs/${product.orgId}/corpora/${corpusId}/exports?format=${format}&split=all`, { headers: product.headers });
    if (res.status !== 200 || !res.body) throw new Error(`export failed: ${res.status}`);
    let documents = 0;
    let carry = "";
    const reader = res.body.getReader();
    const decoder = new TextDecoder();
    for (;;) {
      const { done, value } = await reader.read();
      if (done) break;
      received += value.byteLength;
      // Count documents as they pass, one line each in JSONL and one -DOCSTART- line each in
      // CoNLL, carrying the unfinished last line over to the next chunk.
      const lines = (carry + decoder.decode(value, { stream: true })).split("\n");
      carry = lines.pop() ?? "";
      documents += format === "jsonl" ? lines.length : lines.filter((l) => l === "-DOCSTART-").length;
    }
    const seconds = (performance.now() - t0) / 1000;
    clearInterval(sampler);
    const rss = samples.map((s) => s.rss);
    const peak = Math.max(before, ...rss);
    // Memory at each tenth of the download: flat when streaming, rising when buffering.
    const deciles = Array.from({ length: 10 }, (_, d) => {
      const s = samples[Math.min(samples.length - 1, Math.floor(((d + 1) * samples.length) / 10) - 1)];
      return s ? Math.round(s.rss) : null;
    });
    // Growth while streaming: the highest RSS of the second half of the download against the
    // highest of the first half. The first half includes warm-up (the heap growing to its working
    // size, the cursor code loading); an export that buffered would keep growing to the end.
    const half = Math.floor(rss.length / 2);
    const firstHalf = Math.round(Math.max(before, ...rss.slice(0, half)));
    const secondHalf = Math.round(Math.max(...rss.slice(half)));
    const drift = secondHalf - firstHalf;
    console.log(
      JSON.stringify({
        format,
        documents,
        megabytes: Math.round((received / 1048576) * 10) / 10,
        seconds: Math.round(seconds * 10) / 10,
        documentsPerSecond: Math.round(documents / seconds),
        apiRssBeforeMb: Math.round(before),
        apiRssPeakMb: Math.round(peak),
        apiRssByTenthMb: deciles,
      }),
    );
    const streamedMb = received / 1048576;
    console.log(
      `${format}: ${documents} documents, ${streamedMb.toFixed(1)} MB in ${seconds.toFixed(1)} s; API RSS peak ${firstHalf} MB in the first half, ${secondHalf} MB in the second (${drift >= 0 ? "+" : ""}${drift} MB while ${streamedMb.toFixed(0)} MB streamed) ${drift < Math.max(16, streamedMb / 10) ? "constant: OK" : "GREW: MISSED"}`,
    );
    if (documents !== DOCUMENTS) throw new Error(`expected ${DOCUMENTS} documents, got ${documents}`);
  }
  await db.destroy();
} finally {
  await product.stop();
}
