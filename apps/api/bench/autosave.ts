// Autosave under load: 50 annotators, each with their own connection and session, saving their
// spans for a bounded time against a throwaway PostgreSQL on 127.0.0.1 and the API in its own
// process. Targets: p95 under 50 ms, zero errors, no lost update (each annotator's final version
// equals their number of successful saves and the stored spans equal the last ones saved).
//
// The workspace saves at most once a second per annotator (it waits for a pause of 800 ms), so by
// default each annotator saves RATE = 2 times a second, twice the most a person can cause; the
// annotators start spread over the first second so that they do not save in lock step. RATE 0
// saves as fast as the server answers: that run measures the saturation throughput (its latency
// is then the queueing of 50 callers, not the cost of a save).
//
// Run: cd apps/api && npx tsx bench/autosave.ts [seconds=20] [annotators=50] [rate=2]
import { type ChildProcess, spawn } from "node:child_process";
import path from "node:path";
import { fileURLToPath } from "node:url";
import autocannon from "autocannon";
import { startTempPostgres } from "../../../docker-free-scripts/lib/temp-postgres.mjs";
import { freePort } from "./support/bench-product";

const SECONDS = Number(process.argv[2] ?? 20);
const ANNOTATORS = Number(process.argv[3] ?? 50);
const RATE = Number(process.argv[4] ?? 2);
const P95_TARGET_MS = 50;
const apiDir = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");

// An invented text of about 1,000 tokens with a person's name in every sentence.
function documentText(seed: number): string {
  const first = ["Mira", "Tobin", "Orla", "Edda", "Jory", "Ines", "Hale", "Kit", "Wren", "Brisa"];
  const last = ["Quell", "Vale", "Finch", "Rusk", "Marrow", "Ashby", "Thorne", "Lisle"];
  const sentences: string[] = [];
  for (let i = 0; i < 80; i++) {
    const name = `${first[(i + seed) % first.length]} ${last[(i * 3 + seed) % last.length]}`;
    sentences.push(`On day ${i + 1} ${name} checked the ledger of the Saltmarsh depot and signed it.`);
  }
  return sentences.join(" ");
}

const pg = await startTempPostgres({ label: "bench-autosave" });
let server: ChildProcess | null = null;
try {
  process.env.DATABASE_URL = pg.url;
  process.env.NODE_ENV = "development";
  process.env.LOG_LEVEL = "warn";
  const { migrateLatest } = await import("../src/db/migration-source");
  const { db } = await import("../src/db/knex");
  await migrateLatest(db);

  const port = await freePort();
  const base = `http://127.0.0.1:${port}`;
  // BENCH_PROFILE_DIR=<dir> writes a CPU profile of the API process there.
  const profile = process.env.BENCH_PROFILE_DIR ? ["--cpu-prof", "--cpu-prof-dir", process.env.BENCH_PROFILE_DIR] : [];
  server = spawn(process.execPath, [...profile, "--import", "tsx", "src/server.ts"], {
    cwd: apiDir,
    env: { ...process.env, PORT: String(port), HOST: "127.0.0.1", AUTH_RATE_LIMIT: "100000" },
    stdio: ["ignore", "inherit", "inherit"],
  });
  for (let i = 0; ; i++) {
    const up = await fetch(`${base}/api/health`).then((r) => r.ok).catch(() => false);
    if (up) break;
    if (i > 150) throw new Error("the API did not start");
    await new Promise((r) => setTimeout(r, 200));
  }

  const { hashPassword } = await import("../src/auth/passwords");
  const { insertUser } = await import("../src/auth/users.repository");
  const { addMember } = await import("../src/members/members.service");
  const { createAnnotationData } = await import("../test/support/annotation-data");
  const password = "correct horse battery";
  const signIn = async (email: string): Promise<string> => {
    const res = await fetch(`${base}/api/auth/sign-in`, {
      method: "POST",
      headers: { "Content-Type": "application/json", Origin: base },
      body: JSON.stringify({ email, password }),
    });
    if (res.status !== 200) throw new Error(`sign-in failed: ${res.status}`);
    return res.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
  };
  const signUp = await fetch(`${base}/api/auth/sign-up`, {
    method: "POST",
    headers: { "Content-Type": "application/json", Origin: base },
    body: JSON.stringify({ email: "lead@bench.example.test", password, name: "Bench Lead", organizationName: "Bench Cooperative" }),
  });
  const founder = (await signUp.json()) as { user: { id: string }; organizationId: string };
  const founderCookie = signUp.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
  const orgId = founder.organizationId;
  const hash = await hashPassword(password);
  const annotators: Array<{ userId: string; cookie: string }> = [];
  for (let i = 0; i < ANNOTATORS; i++) {
    const email = `annotator-${i}@bench.example.test`;
    const user = await insertUser({ email, name: `Annotator ${i}`, passwordHash: hash, emailVerified: true });
    await addMember(orgId, user.id, "annotator");
    annotators.push({ userId: user.id, cookie: await signIn(email) });
  }
  const data = await createAnnotationData(orgId, { userId: founder.user.id, email: "lead@bench.example.test" }, {
    corpusName: "Bench corpus",
    types: [{ name: "PERSON", hotkey: "p" }, { name: "PLACE", hotkey: "l" }],
    documents: annotators.map((_, i) => ({ title: `Ledger ${i}`, text: documentText(i) })),
  });
  const batchRes = await fetch(`${base}/api/orgs/${orgId}/corpora/${data.corpusId}/batches`, {
    method: "POST",
    headers: { "Content-Type": "application/json", Origin: base, Cookie: founderCookie },
    body: JSON.stringify({
      name: "Bench batch",
      documentIds: data.documentIds,
      assignment: { mode: "by_hand", documents: data.documentIds.map((documentId, i) => ({ documentId, annotatorIds: [annotators[i]!.userId] })) },
    }),
  });
  if (batchRes.status !== 201) throw new Error(`batch failed: ${batchRes.status} ${await batchRes.text()}`);
  const batchId = ((await batchRes.json()) as { id: string }).id;
  const detail = (await (await fetch(`${base}/api/orgs/${orgId}/corpora/${data.corpusId}/batches/${batchId}`, { headers: { Cookie: founderCookie } })).json()) as {
    documents: Array<{ documentId: string; tokenCount: number; assignments: Array<{ id: string; annotatorId: string }> }>;
  };
  const { tokenizeText } = await import("@tagloom/tagger");

  // Each annotator's candidate spans: every name in their document (two tokens each).
  type State = { url: string; cookie: string; version: number; saves: number; step: number; candidates: object[]; lastSaved: object[]; pending: object[] };
  const states: State[] = annotators.map((a, i) => {
    const doc = detail.documents.find((d) => d.assignments[0]!.annotatorId === a.userId)!;
    const text = documentText(i);
    const { tokens } = tokenizeText(text);
    const candidates: object[] = [];
    for (let t = 0; t + 1 < tokens.length; t++) {
      if (text.slice(tokens[t]!.start, tokens[t]!.end) === "day") {
        // "On day N <First> <Last> checked": the name is tokens t+2 and t+3.
        candidates.push({ start: tokens[t + 2]!.start, end: tokens[t + 3]!.end, type: t % 3 ? "PERSON" : "PLACE" });
      }
    }
    return {
      url: `${base}/api/orgs/${orgId}/corpora/${data.corpusId}/assignments/${doc.assignments[0]!.id}`,
      cookie: a.cookie,
      version: 0,
      saves: 0,
      step: 0,
      candidates,
      lastSaved: [],
      pending: [],
    };
  });
  console.log(`${ANNOTATORS} annotators, ${RATE > 0 ? `${RATE} saves/s each` : "as fast as the server answers"}, documents of ${detail.documents[0]!.tokenCount} tokens, up to ${states[0]!.candidates.length} spans per save, ${SECONDS} s`);

  const latencies: number[] = [];
  const statusCounts = new Map<number, number>();
  let errors = 0;
  let timeouts = 0;
  const runs = states.map(async (st, i) => {
    await new Promise((r) => setTimeout(r, RATE > 0 ? (i * 1000) / ANNOTATORS : 0));
    const instance = autocannon({
      url: st.url,
      connections: 1,
      ...(RATE > 0 ? { connectionRate: RATE } : {}),
      duration: SECONDS,
      timeout: 10,
      requests: [
        {
          method: "PUT",
          setupRequest: (req) => {
            // A growing and shrinking set of spans, as an annotator adds and removes them.
            st.step += 1;
            const n = 10 + (st.step % 30);
            st.pending = st.candidates.slice(0, n);
            return {
              ...req,
              headers: { "Content-Type": "application/json", Origin: base, Cookie: st.cookie },
              body: JSON.stringify({ version: st.version, spans: st.pending }),
            };
          },
          onResponse: (status, body) => {
            if (status === 200) {
              st.version = (JSON.parse(body) as { version: number }).version;
              st.saves += 1;
              st.lastSaved = st.pending;
            }
          },
        },
      ],
    });
    instance.on("response", (_client: unknown, statusCode: number, _bytes: number, responseTime: number) => {
      latencies.push(responseTime);
      statusCounts.set(statusCode, (statusCounts.get(statusCode) ?? 0) + 1);
    });
    return new Promise<autocannon.Result>((resolve, reject) => {
      instance.on("done", resolve);
      instance.on("error", reject);
    }).then((r) => {
      errors += r.errors;
      timeouts += r.timeouts;
      return r;
    });
  });
  await Promise.all(runs);

  latencies.sort((a, b) => a - b);
  const pct = (p: number) => latencies[Math.min(latencies.length - 1, Math.ceil((p / 100) * latencies.length) - 1)]!;
  const non2xx = [...statusCounts.entries()].filter(([s]) => s !== 200).reduce((n, [, c]) => n + c, 0);

  // No lost update: the server's version and spans are exactly the last successful save's.
  let lost = 0;
  for (const st of states) {
    const view = (await (await fetch(st.url, { headers: { Cookie: st.cookie } })).json()) as { version: number; spans: Array<{ start: number; end: number; type: string }> };
    const expected = JSON.stringify(st.lastSaved);
    const actual = JSON.stringify(view.spans.map(({ start, end, type }) => ({ start, end, type })));
    // The save in flight when time ran out may have landed without its answer being read.
    const inFlight = view.version === st.saves + 1 && actual === JSON.stringify(st.pending);
    if (!inFlight && (view.version !== st.saves || actual !== expected)) {
      if (lost === 0) console.log(`first mismatch: server version ${view.version}, saves ${st.saves}; server spans ${actual.slice(0, 200)}; expected ${expected.slice(0, 200)}`);
      lost += 1;
    }
  }

  console.log(`requests: ${latencies.length} (${(latencies.length / SECONDS).toFixed(0)}/s), statuses: ${JSON.stringify(Object.fromEntries(statusCounts))}`);
  console.log(`latency ms: p50 ${pct(50).toFixed(1)}, p90 ${pct(90).toFixed(1)}, p95 ${pct(95).toFixed(1)}, p99 ${pct(99).toFixed(1)}, max ${latencies[latencies.length - 1]!.toFixed(1)}`);
  console.log(`errors: ${errors}, timeouts: ${timeouts}, non-200: ${non2xx}, annotators with a lost update: ${lost}`);
  const clean = errors === 0 && timeouts === 0 && non2xx === 0 && lost === 0;
  // The latency target applies to the annotators' pace; a saturation run only reports throughput.
  const ok = clean && (RATE === 0 || pct(95) < P95_TARGET_MS);
  if (RATE === 0) console.log(`saturation: ${(latencies.length / SECONDS).toFixed(0)} saves/s; ${clean ? "no errors, no lost update" : "ERRORS or LOST UPDATES"}`);
  else console.log(ok ? `PASS: p95 < ${P95_TARGET_MS} ms, no errors, no lost update` : `FAIL: target p95 < ${P95_TARGET_MS} ms, zero errors, no lost update`);
  await db.destroy();
  process.exitCode = ok ? 0 : 1;
} finally {
  if (server && server.exitCode === null) {
    server.kill("SIGTERM");
    await new Promise((r) => server!.once("exit", r));
  }
  pg.stop();
}
