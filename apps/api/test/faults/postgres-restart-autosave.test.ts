import type { Span } from "@tagloom/contracts";
import { tokenizeText } from "@tagloom/tagger";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startTempPostgres } from "../../../../docker-free-scripts/lib/temp-postgres.mjs";

// PostgreSQL is restarted (once orderly, once as a crash) while annotators autosave through HTTP.
// This file has a cluster of its own, so that stopping it disturbs no other test file; the app
// modules are imported only after DATABASE_URL points at it (config/env.ts reads it once).
// Commits are durable (synchronous_commit on), as in production: an acknowledged save must
// survive the crash.
const pg = await startTempPostgres({ label: "autosave-restart", durableCommits: true });
process.env.DATABASE_URL = pg.url;
afterAll(() => pg.stop());

const { db } = await import("@/db/knex");
const { migrateLatest } = await import("@/db/migration-source");
const { TEST_PASSWORD, addSignedInMember, signUpFounder, startTestServer } = await import("../support/http");
const { createAnnotationData } = await import("../support/annotation-data");

// The web client's autosave backoff (apps/web/src/features/workspace/lib/autosaver.ts): network
// errors, 5xx and 429 retry after 1, 2, 4, 8, then every 15 s; a stale version (409) takes the
// server's version and sends the unsaved work again at once.
const BACKOFF_MS = [1000, 2000, 4000, 8000, 15000];
// Quicker than a person marks words (the web client saves at most about once a second), so that
// several saves are in flight whenever PostgreSQL goes away: the case that used to answer 500.
const TYPING_PAUSE_MS = 20;
const WORDS = ["brell", "quon", "tavish", "morrow", "pellin", "ostrel", "viska", "dunmore", "halvey", "sorrel"];
const ANNOTATORS = 4;
const DOCUMENTS_EACH = 2;

type Stream = {
  assignmentId: string;
  cookie: string;
  /** Spans of the words in order: save k holds the first k of them. */
  candidates: Span[];
  acks: Array<{ version: number; spans: Span[] }>;
  /** What the server said it held when it answered 409: always an earlier send of this client. */
  staleCopies: Span[][];
};
type Outcomes = { ok: number; stale: number; unavailable: number; network: number; unexpected: Array<{ status: number; body: string }>; missingRetryAfter: number };

let base: string;
let url: string;
let orgId: string;
let corpusId: string;
let typeIdByName: Map<string, string>;
const streams: Stream[] = [];
const outcomes: Outcomes = { ok: 0, stale: 0, unavailable: 0, network: 0, unexpected: [], missingRetryAfter: 0 };

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

beforeAll(async () => {
  await migrateLatest(db);
  const server = await startTestServer();
  url = server.url;
  const admin = await signUpFounder(server, { organizationName: "Restart Marsh Bureau" });
  orgId = admin.orgId;
  const annotators = await Promise.all(Array.from({ length: ANNOTATORS }, (_, i) => addSignedInMember(server, orgId, "annotator", `Saver ${i + 1}`)));
  const text = Array.from({ length: 400 }, (_, i) => WORDS[i % WORDS.length]).join(" ") + ".";
  const data = await createAnnotationData(orgId, { userId: admin.userId, email: admin.email }, {
    types: [{ name: "PLACE" }],
    documents: Array.from({ length: ANNOTATORS * DOCUMENTS_EACH }, (_, i) => ({ title: `Field sheet ${i + 1}`, text })),
  });
  corpusId = data.corpusId;
  typeIdByName = new Map(Object.entries(data.types).map(([name, t]) => [name, t.id]));
  base = `${url}/api/orgs/${orgId}/corpora/${corpusId}`;
  const batch = await admin.agent
    .post(`/api/orgs/${orgId}/corpora/${corpusId}/batches`)
    .send({ name: "Restart round", documentIds: data.documentIds, assignment: { mode: "round_robin", annotatorIds: annotators.map((a) => a.userId), annotatorsPerDocument: 1 } });
  expect(batch.status, JSON.stringify(batch.body)).toBe(201);
  const candidates = tokenizeText(text)
    .tokens.filter((t) => /^[a-z]+$/.test(text.slice(t.start, t.end)))
    .map((t) => ({ start: t.start, end: t.end, type: "PLACE" }));
  const rows = await db("assignments").where({ organization_id: orgId, batch_id: batch.body.id }).select("id", "annotator_id");
  expect(rows).toHaveLength(ANNOTATORS * DOCUMENTS_EACH);
  for (const row of rows as Array<{ id: string; annotator_id: string }>) {
    const who = annotators.find((a) => a.userId === row.annotator_id)!;
    streams.push({ assignmentId: row.id, cookie: await signIn(who.email), candidates, acks: [], staleCopies: [] });
  }
}, 90_000);

/** A browser session of its own for each stream (a tab), made with a plain sign-in. */
async function signIn(email: string): Promise<string> {
  const res = await fetch(`${url}/api/auth/sign-in`, {
    method: "POST",
    headers: { "Content-Type": "application/json", Origin: url },
    body: JSON.stringify({ email, password: TEST_PASSWORD }),
  });
  expect(res.status).toBe(200);
  return res.headers.getSetCookie().find((c) => c.startsWith("tagloom_session="))!.split(";")[0]!;
}

const key = (s: Span) => `${s.start}:${s.end}:${s.type}`;

/** One annotator's tab: marks one more word, saves until the API acknowledges it, repeats. */
async function autosave(stream: Stream, shouldStop: () => boolean): Promise<void> {
  const view = await fetch(`${base}/assignments/${stream.assignmentId}`, { headers: { Cookie: stream.cookie } });
  expect(view.status).toBe(200);
  let version = ((await view.json()) as { version: number }).version;
  for (let k = 1; k <= stream.candidates.length && !shouldStop(); k++) {
    const spans = stream.candidates.slice(0, k);
    let attempts = 0;
    for (;;) {
      let res: Response;
      try {
        res = await fetch(`${base}/assignments/${stream.assignmentId}`, {
          method: "PUT",
          headers: { "Content-Type": "application/json", Cookie: stream.cookie, Origin: url },
          body: JSON.stringify({ version, spans, dismissedSuggestions: [] }),
          signal: AbortSignal.timeout(20_000),
        });
      } catch {
        outcomes.network++;
        await sleep(BACKOFF_MS[Math.min(attempts++, BACKOFF_MS.length - 1)]!);
        continue;
      }
      const body = await res.text();
      if (res.status === 200) {
        outcomes.ok++;
        version = (JSON.parse(body) as { version: number }).version;
        stream.acks.push({ version, spans });
        break;
      }
      const error = (JSON.parse(body) as { error?: { code?: string; details?: { version: number; spans: Span[] } } }).error;
      if (res.status === 409 && error?.code === "stale_version" && error.details) {
        // An earlier attempt was stored but its answer was lost in the outage.
        outcomes.stale++;
        stream.staleCopies.push(error.details.spans.map((s) => ({ start: s.start, end: s.end, type: s.type })));
        version = error.details.version;
        continue;
      }
      if (res.status === 503) {
        outcomes.unavailable++;
        if (!res.headers.get("retry-after")) outcomes.missingRetryAfter++;
      } else {
        outcomes.unexpected.push({ status: res.status, body });
      }
      await sleep(BACKOFF_MS[Math.min(attempts++, BACKOFF_MS.length - 1)]!);
    }
    await sleep(TYPING_PAUSE_MS);
  }
}

async function untilEachHas(count: (s: Stream) => number, n: number, timeoutMs: number): Promise<void> {
  const until = Date.now() + timeoutMs;
  while (!streams.every((s) => count(s) >= n)) {
    if (Date.now() > until) throw new Error(`not every stream reached ${n} acknowledged saves: ${streams.map(count).join(", ")}`);
    await sleep(50);
  }
}

describe("PostgreSQL restarted while annotators autosave", () => {
  it("keeps every acknowledged save with its spans and never answers 500", async () => {
    let stop = false;
    const running = Promise.all(streams.map((s) => autosave(s, () => stop)));
    try {
      await untilEachHas((s) => s.acks.length, 3, 30_000);
      for (const mode of ["fast", "immediate"] as const) {
        const before = streams.map((s) => s.acks.length);
        await pg.stopServer({ mode });
        await sleep(1500);
        await pg.startServer();
        await untilEachHas((s) => s.acks.length - before[streams.indexOf(s)]!, 3, 45_000);
      }
    } finally {
      stop = true;
      await running;
    }

    expect(outcomes.unexpected).toEqual([]);
    expect(outcomes.missingRetryAfter).toBe(0);
    // The outages were seen (otherwise this test proves nothing).
    expect(outcomes.unavailable + outcomes.network).toBeGreaterThan(0);

    const rows = await db("assignments").whereIn("id", streams.map((s) => s.assignmentId)).select("id", "version", "spans");
    const nameOf = new Map([...typeIdByName].map(([name, id]) => [id, name]));
    for (const stream of streams) {
      const row = (rows as Array<{ id: string; version: number; spans: Array<{ start: number; end: number; typeId: string }> }>).find((r) => r.id === stream.assignmentId)!;
      const stored = new Set(row.spans.map((s) => key({ start: s.start, end: s.end, type: nameOf.get(s.typeId)! })));
      const versions = stream.acks.map((a) => a.version);
      expect(versions, "acknowledged versions only go up").toEqual([...versions].sort((a, b) => a - b));
      expect(new Set(versions).size).toBe(versions.length);
      const last = stream.acks.at(-1)!;
      expect(row.version).toBe(last.version);
      expect([...stored].sort()).toEqual(last.spans.map(key).sort());
      for (const ack of stream.acks) expect(ack.spans.every((s) => stored.has(key(s))), `save ${ack.version} of ${stream.assignmentId}`).toBe(true);
      // A 409 showed a copy this client had sent: nothing foreign, nothing half-written.
      for (const copy of stream.staleCopies) expect(copy.map(key)).toEqual(stream.candidates.slice(0, copy.length).map(key));
    }
  }, 180_000);
});
