import type { TrainingRun } from "@tagloom/contracts";
import { beforeAll, describe, expect, it } from "vitest";
import { env } from "@/config/env";
import { db } from "@/db/knex";
import { type SignedIn, type TestServer, signUpFounder, startTestServer } from "./support/http";
import { stopProcess } from "./support/server-process";
import { createTrainingCorpus, generateDocuments } from "./support/training-data";
import { startWorkerProcess } from "./support/workers";

// Workers are separate processes here (src/worker.ts), as in production: one is killed with
// SIGKILL in the middle of a run, and pg-boss hands the job to another once it expires.
const EXPIRE_SECONDS = 5;
let server: TestServer;
let founder: SignedIn;
let corpusId: string;

beforeAll(async () => {
  server = await startTestServer();
  founder = await signUpFounder(server, { organizationName: "Worker Kill Org" });
  ({ corpusId } = await createTrainingCorpus(founder.orgId, { userId: founder.userId, email: founder.email }, "Big memos", generateDocuments(160, 10, 21)));
  // Jobs this process sends expire quickly, so a dead worker's job is retried within the test.
  env.TRAINING_JOB_EXPIRE_SECONDS = EXPIRE_SECONDS;
}, 60_000);

// Workers spawned with the short expiry too (the jobs they send on expire as quickly).
const startWorker = () => startWorkerProcess({ TRAINING_JOB_EXPIRE_SECONDS: String(EXPIRE_SECONDS) });

const base = () => `/api/orgs/${founder.orgId}/corpora/${corpusId}`;
const getRun = async (id: string) => (await founder.agent.get(`${base()}/runs/${id}`)).body as TrainingRun;

async function waitFor(id: string, done: (r: TrainingRun) => boolean, timeoutMs: number, intervalMs = 50): Promise<TrainingRun> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const run = await getRun(id);
    if (done(run)) return run;
    if (Date.now() > until) throw new Error(`run ${id} stuck at ${run.status}/${run.stage}`);
    await new Promise((r) => setTimeout(r, intervalMs));
  }
}

describe("training runs and worker processes", () => {
  it("a waiting run is cancelled at once", async () => {
    const res = await founder.agent.post(`${base()}/runs`).send({ crossValidationFolds: null });
    expect([res.status, res.body.status]).toEqual([202, "queued"]);
    const cancelled = await founder.agent.post(`${base()}/runs/${res.body.id}/cancel`).send({});
    expect([cancelled.status, cancelled.body.status]).toEqual([200, "cancelled"]);
    expect(await db("audit_events").where({ organization_id: founder.orgId, action: "training_run.cancelled" }).count<{ n: number }[]>({ n: "*" })).toEqual([{ n: 1 }]);
  });

  it("a worker killed mid-run: pg-boss retries the job on another worker and exactly one tagger results", async () => {
    const res = await founder.agent.post(`${base()}/runs`).send({ crossValidationFolds: 5 });
    expect(res.status).toBe(202);
    const runId = res.body.id as string;
    const first = startWorker();
    // Kill it while the finishing job (cross-validation) is running.
    const mid = await waitFor(runId, (r) => r.stage === "cross_validation" || r.status !== "queued" && r.status !== "running", 60_000, 20);
    expect([mid.status, mid.stage]).toEqual(["running", "cross_validation"]);
    first.kill("SIGKILL");
    await new Promise((r) => first.once("exit", r));
    expect((await getRun(runId)).status).toBe("running");

    const second = startWorker();
    const done = await waitFor(runId, (r) => r.status !== "running" && r.status !== "queued", 90_000, 200);
    expect(done.status, done.error ?? "").toBe("succeeded");
    expect(await db("taggers").where({ run_id: runId }).count<{ n: number }[]>({ n: "*" })).toEqual([{ n: 1 }]);
    const job = await db.raw("SELECT state, retry_count FROM pgboss.job WHERE name = 'training-finish' AND data->>'runId' = ?", [runId]);
    expect(job.rows).toEqual([{ state: "completed", retry_count: 1 }]);
    await stopProcess(second);
  }, 150_000);
});
