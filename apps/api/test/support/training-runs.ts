import type { TrainingRun } from "@tagloom/contracts";
import type TestAgent from "supertest/lib/agent";
import { expect } from "vitest";

/**
 * Starting training runs through the API and waiting for them, for a member's agent and a
 * corpus's base path (both read when called, so they may be set in beforeAll).
 */
export function trainingRuns(agent: () => TestAgent, base: () => string, timeoutMs: number) {
  /** Polls the run until it has finished (succeeded, failed or cancelled). */
  async function waitForRun(runId: string, waitMs = timeoutMs): Promise<TrainingRun> {
    const until = Date.now() + waitMs;
    for (;;) {
      const res = await agent().get(`${base()}/runs/${runId}`);
      expect(res.status).toBe(200);
      if (["succeeded", "failed", "cancelled"].includes(res.body.status)) return res.body as TrainingRun;
      if (Date.now() > until) throw new Error(`run ${runId} still ${res.body.status}/${res.body.stage}`);
      await new Promise((r) => setTimeout(r, 150));
    }
  }

  /** Starts a run with `body` and returns it once it has succeeded. */
  async function trainedRun(body: object): Promise<TrainingRun> {
    const res = await agent().post(`${base()}/runs`).send(body);
    expect(res.status, JSON.stringify(res.body)).toBe(202);
    const run = await waitForRun(res.body.id);
    expect(run.status, run.error ?? "").toBe("succeeded");
    return run;
  }

  return { waitForRun, trainedRun };
}
