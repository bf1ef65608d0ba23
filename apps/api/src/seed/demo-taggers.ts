import type { StartRunInput, TrainingRun } from "@tagloom/contracts";
import type { Actor } from "@/audit/audit.service";
import { db } from "@/db/knex";
import { setSuggester } from "@/suggestions/suggestions.service";
import { getRun, startRun } from "@/training/training-runs.service";
import { waitFor } from "./demo-wait";

/**
 * Two settings the data lead can compare: the engine's full feature set, and a plain tagger
 * without word context, suffixes or fine word classes.
 */
export const demoRunSettings: { label: string; input: StartRunInput }[] = [
  { label: "full features", input: { crossValidationFolds: 3, seed: 1 } },
  { label: "plain", input: { wordClasses: "bikel", suffixLength: 0, prevWord: false, contextEmissions: false, crossValidationFolds: null, seed: 1 } },
];

const TRAINING_TIMEOUT_MS = 15 * 60_000;

/**
 * Trains both demo taggers through the training service (the worker processes the runs' jobs),
 * makes the one with the higher test F1 the corpus's suggester, and waits until its suggestion
 * run has tagged every document without gold.
 */
export async function seedTaggers(organizationId: string, corpusId: string, lead: Actor & { userId: string }): Promise<{ runs: TrainingRun[]; suggesterId: string }> {
  const started: TrainingRun[] = [];
  for (const s of demoRunSettings) started.push(await startRun(organizationId, corpusId, s.input, lead));
  const runs: TrainingRun[] = [];
  for (const run of started) {
    const done = await waitFor(
      `training run ${run.number}`,
      async () => {
        const r = await getRun(organizationId, corpusId, run.id);
        return ["succeeded", "failed", "cancelled"].includes(r.status) ? r : null;
      },
      TRAINING_TIMEOUT_MS,
      500,
    );
    if (done.status !== "succeeded" || !done.taggerId) throw new Error(`demo data: training run ${done.number} ended ${done.status}: ${done.error ?? ""}`);
    runs.push(done);
  }
  const f1 = (r: TrainingRun) => r.evaluation?.overall.f1 ?? 0;
  const best = runs.reduce((a, b) => (f1(b) > f1(a) ? b : a));
  await setSuggester(organizationId, corpusId, { taggerId: best.taggerId! }, lead);
  await waitFor(
    "the suggestions of the demo suggester",
    async () => {
      const open = await db("suggestion_runs").where({ organization_id: organizationId, corpus_id: corpusId, tagger_id: best.taggerId }).whereNull("finished_at").first("id");
      return open ? null : true;
    },
    TRAINING_TIMEOUT_MS,
    500,
  );
  return { runs, suggesterId: best.taggerId! };
}
