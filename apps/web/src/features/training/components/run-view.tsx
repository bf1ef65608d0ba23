import { finishedRunStatuses, runStageLabels, runStageNames, type TrainingRun } from "@tagloom/contracts";
import { useState } from "react";
import { Link, useNavigate } from "react-router";
import { Button } from "@/components/ui/button";
import { Card, Notice } from "@/components/ui/card";
import { Dialog } from "@/components/ui/dialog";
import { useToast } from "@/components/ui/toaster";
import { paths } from "@/config/paths";
import { formatDateTime } from "@/lib/dates";
import { useCancelRun } from "../api/cancel-run";
import { useRepeatRun } from "../api/repeat-run";
import { IterationsView } from "./iterations-table";
import { ConfigList } from "./config-list";
import { RunStatus, score } from "./run-status";

/** Where a run stands: the stages done, the one in progress, the passes so far, and what to do next. */
export function RunView({ orgId, corpusId, run, canTrain }: { orgId: string; corpusId: string; run: TrainingRun; canTrain: boolean }) {
  const cancel = useCancelRun(orgId, corpusId, run.id);
  const repeat = useRepeatRun(orgId, corpusId, run.id);
  const toast = useToast();
  const navigate = useNavigate();
  const [confirming, setConfirming] = useState(false);
  const finished = finishedRunStatuses.includes(run.status);
  const reached = run.stage ? runStageNames.indexOf(run.stage) : -1;
  const stages = runStageNames.filter((s) => s !== "unlabelled" || run.config.semi !== "none").filter((s) => s !== "cross_validation" || run.config.crossValidationFolds !== null);

  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <div className="flex flex-wrap items-center gap-3">
          <h2 className="text-lg font-semibold text-ink-900">Run {run.number}</h2>
          <RunStatus run={run} />
          {run.repeatOfRunId ? <span className="text-xs text-ink-500">repeat of an earlier run</span> : null}
        </div>
        {canTrain ? (
          <div className="flex gap-2">
            {!finished ? (
              <Button variant="danger" size="sm" disabled={run.cancelRequested} onClick={() => setConfirming(true)}>
                Cancel run
              </Button>
            ) : null}
            <Button
              variant="secondary"
              size="sm"
              busy={repeat.isPending}
              onClick={async () => {
                try {
                  const next = await repeat.mutateAsync();
                  toast.show(`Run ${next.number} started with the same settings and documents.`, "success");
                  navigate(paths.org.run.build(orgId, corpusId, next.id));
                } catch (err) {
                  toast.show(err instanceof Error ? err.message : "The run could not be repeated.", "error");
                }
              }}
            >
              Repeat run
            </Button>
          </div>
        ) : null}
      </div>

      {run.status === "failed" && run.error ? (
        <Notice tone="error">
          <strong>The run failed:</strong> {run.error}
        </Notice>
      ) : null}
      {run.status === "cancelled" ? <Notice tone="warn">This run was cancelled; it stored no tagger.</Notice> : null}
      {run.status === "succeeded" && run.taggerId && run.evaluation ? (
        <Notice>
          Finished: test F1 {score(run.evaluation.overall.f1)} on {run.evaluation.documents} documents.{" "}
          <Link className="font-medium underline" to={paths.org.tagger.build(orgId, corpusId, run.taggerId)}>
            Open the tagger
          </Link>
        </Notice>
      ) : null}

      <Card>
        <h3 className="mb-2 font-semibold text-ink-900">Stages</h3>
        <ol className="space-y-1 text-sm" aria-label="Stages">
          {stages.map((s) => {
            const i = runStageNames.indexOf(s);
            const state = run.status === "succeeded" || i < reached ? "done" : i === reached && run.status === "running" ? "current" : "later";
            return (
              <li key={s} className="flex items-center gap-2" aria-current={state === "current" ? "step" : undefined}>
                <span aria-hidden className={state === "done" ? "text-moss-500" : state === "current" ? "text-thread-500" : "text-ink-300"}>
                  {state === "done" ? "●" : state === "current" ? "◐" : "○"}
                </span>
                <span className={state === "later" ? "text-ink-400" : "text-ink-800"}>{runStageLabels[s]}</span>
                <span className="sr-only">({state === "done" ? "done" : state === "current" ? "in progress" : "not reached"})</span>
                {state === "current" ? <span className="text-xs text-ink-500">{Math.round(run.progress * 100)} %</span> : null}
              </li>
            );
          })}
        </ol>
        <p className="mt-3 text-xs text-ink-500">
          {run.documentCounts.train} training documents, {run.documentCounts.test} test documents
          {run.config.semi !== "none" || run.config.clusters > 0 ? `, ${run.documentCounts.unlabelled} without gold` : ""}
          {run.documentCounts.unlabelledLeftOut ? ` (${run.documentCounts.unlabelledLeftOut} more left out: over the token limit for documents without gold)` : ""} · counted in {run.shardCount} {run.shardCount === 1 ? "shard" : "shards"} · queued{" "}
          {formatDateTime(run.createdAt)}
          {run.finishedAt ? ` · ended ${formatDateTime(run.finishedAt)}` : ""}
        </p>
      </Card>

      {run.config.semi !== "none" ? (
        <Card>
          <h3 className="mb-2 font-semibold text-ink-900">Passes over documents without gold</h3>
          <IterationsView iterations={run.iterations} method={run.config.semi} />
        </Card>
      ) : null}

      <Card>
        <h3 className="mb-2 font-semibold text-ink-900">Settings</h3>
        <ConfigList config={run.config} seed={run.seed} testSplit={run.testSplit} />
      </Card>

      <Dialog open={confirming} title={`Cancel run ${run.number}?`} onClose={() => setConfirming(false)}>
        <p className="mb-4 text-sm text-ink-600">The run stops at its next step and stores no tagger. Its settings stay here, so you can repeat it later.</p>
        <div className="flex justify-end gap-2">
          <Button variant="ghost" onClick={() => setConfirming(false)}>
            Keep training
          </Button>
          <Button
            variant="danger"
            busy={cancel.isPending}
            onClick={async () => {
              try {
                await cancel.mutateAsync();
                toast.show(`Run ${run.number} is being cancelled.`, "success");
              } catch (err) {
                toast.show(err instanceof Error ? err.message : "The run could not be cancelled.", "error");
              }
              setConfirming(false);
            }}
          >
            Cancel the run
          </Button>
        </div>
      </Dialog>
    </div>
  );
}
