import { type TrainingRun, runStageLabels, runStatusLabels, trainingConfigDefaults } from "@tagloom/contracts";
import { configure, screen, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { HttpResponse, http } from "msw";
import { describe, expect, it } from "vitest";
import { server } from "@/testing/server";
import { renderWithProviders } from "@/testing/test-utils";
import { useRun } from "../api/get-run";
import { RunView } from "./run-view";

configure({ asyncUtilTimeout: 6000 });

const ORG = "11111111-1111-4111-8111-111111111111";
const CORPUS = "22222222-2222-4222-8222-222222222222";
const RUN = "33333333-3333-4333-8333-333333333333";

const { crossValidationFolds, testSplit, seed, ...engine } = trainingConfigDefaults;
const base: TrainingRun = {
  id: RUN,
  corpusId: CORPUS,
  number: 3,
  status: "running",
  stage: "counting",
  progress: 0.4,
  cancelRequested: false,
  iterations: [],
  error: null,
  config: { ...engine, crossValidationFolds },
  seed,
  testSplit,
  documentCounts: { train: 12, test: 4, unlabelled: 30 },
  shardCount: 2,
  taggerId: null,
  evaluation: null,
  repeatOfRunId: null,
  createdAt: "2031-03-01T10:00:00Z",
  startedAt: "2031-03-01T10:00:01Z",
  finishedAt: null,
  createdBy: null,
};

function Live() {
  const run = useRun(ORG, CORPUS, RUN);
  return run.data ? <RunView orgId={ORG} corpusId={CORPUS} run={run.data} canTrain /> : null;
}

describe("the run page", () => {
  it("follows the run while it trains and stops asking once it has failed, saying why", async () => {
    let calls = 0;
    server.use(
      http.get(`/api/orgs/${ORG}/corpora/${CORPUS}/runs/${RUN}`, () => {
        calls += 1;
        if (calls === 1) return HttpResponse.json(base);
        if (calls === 2) return HttpResponse.json({ ...base, stage: "evaluation" });
        return HttpResponse.json({ ...base, status: "failed", stage: "evaluation", error: "The test split has no gold documents.", finishedAt: "2031-03-01T10:01:00Z" });
      }),
    );
    renderWithProviders(<Live />);
    const stages = await screen.findByRole("list", { name: "Stages" });
    expect(within(stages).getByText(runStageLabels.counting).closest("li")).toHaveAttribute("aria-current", "step");
    await screen.findByText(runStageLabels.evaluation, { selector: "li[aria-current] span" });
    expect(await screen.findByText("The test split has no gold documents.")).toBeInTheDocument();
    expect(screen.getByText(runStatusLabels.failed)).toBeInTheDocument();
    const after = calls;
    await new Promise((r) => setTimeout(r, 1500));
    expect(calls).toBe(after);
  });

  it("cancels after a confirmation", async () => {
    let cancelled = false;
    server.use(
      http.get(`/api/orgs/${ORG}/corpora/${CORPUS}/runs/${RUN}`, () => HttpResponse.json(cancelled ? { ...base, status: "cancelled", finishedAt: "2031-03-01T10:01:00Z" } : base)),
      http.post(`/api/orgs/${ORG}/corpora/${CORPUS}/runs/${RUN}/cancel`, () => {
        cancelled = true;
        return HttpResponse.json({ ...base, cancelRequested: true });
      }),
    );
    renderWithProviders(<Live />);
    await userEvent.click(await screen.findByRole("button", { name: "Cancel run" }));
    await userEvent.click(screen.getByRole("button", { name: "Cancel the run" }));
    expect(await screen.findByText("This run was cancelled; it stored no tagger.")).toBeInTheDocument();
    expect(cancelled).toBe(true);
  });

  it("shows word clusters and perceptron passes in the settings, and how many documents without gold were left out", () => {
    const run: TrainingRun = {
      ...base,
      config: { ...base.config, clusters: 50, perceptron: 3, perceptronFeatures: "neighbours" },
      documentCounts: { train: 12, test: 4, unlabelled: 30, unlabelledLeftOut: 7, unlabelledTokens: 200_000 },
      shardCount: 1,
    };
    renderWithProviders(<RunView orgId={ORG} corpusId={CORPUS} run={run} canTrain={false} />);
    const clusters = screen.getByText("Word clusters").nextElementSibling!;
    expect(clusters).toHaveTextContent("50, learnt with the documents without gold (changed)");
    expect(screen.getByText("Perceptron passes").nextElementSibling).toHaveTextContent("3, word and neighbour features (changed)");
    expect(screen.getByText(/30 without gold \(7 more left out: over the token limit/)).toBeInTheDocument();
  });
});
