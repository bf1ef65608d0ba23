// Documents table queries at 100,000 documents in one corpus: list, sort, filter and search, each
// timed by PostgreSQL (EXPLAIN ANALYZE execution time, median and worst of repeated runs) and
// through HTTP (the whole API round trip), with the plan's index use printed.
// Target (issue 5): every query under 50 ms with an index in its plan.
//
// Run: cd apps/api && npx tsx bench/documents-query.ts [documents=100000] [tokensPerDocument=120]
import { startBenchProduct } from "./support/bench-product";
import { seedDocuments } from "./support/seed-documents";

const DOCUMENTS = Number(process.argv[2] ?? 100_000);
const TOKENS = Number(process.argv[3] ?? 120);
const RUNS = 15;
const TARGET_MS = 50;

const product = await startBenchProduct("bench-documents-query");
try {
  const { db } = await import("../src/db/knex");
  const corpusRes = await fetch(`${product.base}/api/orgs/${product.orgId}/corpora`, {
    method: "POST",
    headers: { ...product.headers, "Content-Type": "application/json" },
    body: JSON.stringify({ name: "Query bench" }),
  });
  const corpusId = ((await corpusRes.json()) as { id: string }).id;
  const typeRes = await fetch(`${product.base}/api/orgs/${product.orgId}/corpora/${corpusId}/entity-types`, {
    method: "POST",
    headers: { ...product.headers, "Content-Type": "application/json" },
    body: JSON.stringify({ name: "PARTY" }),
  });
  const typeId = ((await typeRes.json()) as { id: string }).id;
  const seedStart = performance.now();
  await seedDocuments(db, { organizationId: product.orgId, corpusId, count: DOCUMENTS, tokens: TOKENS, goldTypeId: typeId, goldEvery: 2, userId: product.userId }, (n) => {
    if (n % 20_000 === 0) console.log(`seeded ${n} documents`);
  });
  console.log(`seeded ${DOCUMENTS} documents of ~${TOKENS} tokens in ${((performance.now() - seedStart) / 1000).toFixed(1)} s`);

  const { listDocuments } = await import("../src/documents/documents.repository");
  // A cursor deep in the list: the 50th page of the default order.
  const deep = await db("documents").where({ corpus_id: corpusId }).orderBy([{ column: "created_at", order: "desc" }, { column: "id", order: "desc" }]).offset(2500).first(db.raw("created_at::text AS v"), "id");
  const titleDeep = await db("documents").where({ corpus_id: corpusId }).orderBy([{ column: "title" }, { column: "id" }]).offset(Math.floor(DOCUMENTS * 0.4)).first("title", "id");

  type Case = { name: string; filter: Parameters<typeof listDocuments>[2]; after?: { value: string | number; id: string }; http: string };
  const cases: Case[] = [
    { name: "newest first (first page)", filter: { sort: "created", dir: "desc" }, http: "sort=created&dir=desc" },
    { name: "newest first (page 51, by cursor)", filter: { sort: "created", dir: "desc" }, after: { value: deep.v, id: deep.id }, http: "" },
    { name: "title A→Z", filter: { sort: "title", dir: "asc" }, http: "sort=title&dir=asc" },
    { name: "title A→Z (deep cursor)", filter: { sort: "title", dir: "asc" }, after: { value: titleDeep.title, id: titleDeep.id }, http: "" },
    { name: "most tokens first", filter: { sort: "tokens", dir: "desc" }, http: "sort=tokens&dir=desc" },
    { name: "split = test", filter: { sort: "created", dir: "desc", split: "test" }, http: "split=test" },
    { name: "status = gold, title", filter: { sort: "title", dir: "asc", status: "gold" }, http: "status=gold&sort=title&dir=asc" },
    { name: "split none + status none", filter: { sort: "created", dir: "desc", split: "none", status: "none" }, http: "split=none&status=none" },
    { name: "search common word (harbour)", filter: { sort: "created", dir: "desc", q: "harbour" }, http: "q=harbour" },
    { name: "search uncommon word (kalori, ~2% of documents)", filter: { sort: "created", dir: "desc", q: "kalori" }, http: "q=kalori" },
    { name: "search two words, by title", filter: { sort: "title", dir: "asc", q: "kalori ledger" }, http: "q=kalori%20ledger&sort=title&dir=asc" },
    { name: "search a number in one document's title", filter: { sort: "created", dir: "desc", q: "073412" }, http: "q=073412" },
    { name: "search absent word", filter: { sort: "created", dir: "desc", q: "zzyzx" }, http: "q=zzyzx" },
  ];

  const results: Array<Record<string, unknown>> = [];
  for (const c of cases) {
    // The SQL the repository runs, timed and explained by PostgreSQL itself.
    const { sql, bindings } = await captureSql(db, () => listDocuments(product.orgId, corpusId, c.filter, { limit: 51, after: c.after }, db));
    const times: number[] = [];
    let plan = "";
    for (let i = 0; i < RUNS; i++) {
      const explain = await db.raw(`EXPLAIN (ANALYZE, BUFFERS, FORMAT TEXT) ${sql}`, bindings as import("knex").Knex.RawBinding[]);
      const lines: string[] = explain.rows.map((r: { "QUERY PLAN": string }) => r["QUERY PLAN"]);
      times.push(Number(/Execution Time: ([\d.]+) ms/.exec(lines.join("\n"))?.[1] ?? NaN));
      if (i === 0) plan = lines.filter((l) => /Index|Bitmap|Seq Scan|Sort|Limit/.test(l)).map((l) => l.trim().replace(/\s+\(cost=.*$/, "")).join(" | ");
    }
    const httpTimes: number[] = [];
    if (c.http !== "" || c.after) {
      const query = c.after ? "" : c.http;
      for (let i = 0; i < RUNS; i++) {
        const t0 = performance.now();
        const res = await fetch(`${product.base}/api/orgs/${product.orgId}/corpora/${corpusId}/documents?limit=50&${query}`, { headers: product.headers });
        await res.json();
        httpTimes.push(performance.now() - t0);
      }
    }
    times.sort((a, b) => a - b);
    httpTimes.sort((a, b) => a - b);
    const median = times[Math.floor(times.length / 2)]!;
    const worst = times[times.length - 1]!;
    results.push({
      query: c.name,
      dbMedianMs: Number(median.toFixed(2)),
      dbWorstMs: Number(worst.toFixed(2)),
      httpMedianMs: httpTimes.length ? Number(httpTimes[Math.floor(httpTimes.length / 2)]!.toFixed(1)) : null,
      usesIndex: /Index|Bitmap Index/.test(plan) && !/Seq Scan on documents/.test(plan),
      ok: worst < TARGET_MS,
      plan,
    });
  }
  for (const r of results) {
    console.log(`\n${r.query}: db median ${r.dbMedianMs} ms, worst ${r.dbWorstMs} ms, http median ${r.httpMedianMs ?? "-"} ms, index ${r.usesIndex ? "yes" : "NO"} ${r.ok ? "OK" : "MISSED"}`);
    console.log(`  plan: ${r.plan}`);
  }
  const failed = results.filter((r) => !r.ok || !r.usesIndex);
  console.log(`\n${results.length - failed.length}/${results.length} queries under ${TARGET_MS} ms with an index${failed.length ? `; missed: ${failed.map((r) => r.query).join(", ")}` : ""}`);
  await db.destroy();
} finally {
  await product.stop();
}

/** Runs a repository call once and returns the SQL of its query (Knex's query event). */
async function captureSql(db: import("knex").Knex, run: () => Promise<unknown>): Promise<{ sql: string; bindings: readonly unknown[] }> {
  let captured: { sql: string; bindings: readonly unknown[] } | null = null;
  const listener = (q: { sql: string; bindings: readonly unknown[] }) => {
    captured ??= q;
  };
  db.on("query", listener);
  try {
    await run();
  } finally {
    db.removeListener("query", listener);
  }
  if (!captured) throw new Error("no query captured");
  const { sql, bindings } = captured as { sql: string; bindings: readonly unknown[] };
  // Knex's pg dialect writes $1, $2…; knex.raw wants ? placeholders.
  return { sql: sql.replace(/\$\d+/g, "?"), bindings };
}
