import { describe, expect, it } from "vitest";
import { sentenceLogLikelihood } from "../model/decode";
import { createRng } from "../util/random";
import { refineWithUnlabelled } from "./semi-supervised";
import { trainTagger } from "../model/tagger";
import type { TaggerModel } from "../model/tagger-model";
import { tinyDocuments, tinyUnlabelled } from "../testing/tiny-corpus";
import { prepareTrainingData } from "../estimation/training-data";
import { resolveTrainingConfig, type TrainingConfig } from "../estimation/training-config";

/**
 * The quantity EM with add-λ estimates maximises (MAP-EM, Dempster, Laird & Rubin 1977 §3): W ×
 * the unlabelled log-likelihood plus Σ (labelled count + λ) · log θ over every start, transition,
 * end and emission cell.
 */
function objective(model: TaggerModel, labelled: TaggerModel["statistics"], weight: number, unlabelled: string[][][]): number {
  const { parameters: p, config } = model;
  const K = model.tags.length;
  const add = (count: number, prior: number, logTheta: number) => (count + prior === 0 ? 0 : (count + prior) * logTheta);
  let total = 0;
  for (const doc of unlabelled) doc.forEach((words, s) => (total += weight * sentenceLogLikelihood(model, words, s)));
  const startPrior = (k: number) => (model.constraints !== null && model.constraints.allowedStart[k] === 0 ? 0 : config.smoothing.start);
  const transitionPrior = (x: number) => (model.constraints !== null && model.constraints.allowed[x] === 0 ? 0 : config.smoothing.transition);
  for (let k = 0; k < K; k++) total += add(labelled.start[k], startPrior(k), p.start[k]);
  for (let x = 0; x < K * K; x++) total += add(labelled.transitions[x], transitionPrior(x), p.transitions[x]);
  if (p.end !== null) for (let k = 0; k < K; k++) total += add(labelled.end[k], config.smoothing.transition, p.end[k]);
  for (let x = 0; x < p.emissions.length; x++) total += add(labelled.emissions[x], config.smoothing.emission, p.emissions[x]);
  return total;
}

const simple: Partial<TrainingConfig> = { prevWord: false, contextEmissions: false, positionBuckets: { token: [], sentence: [] }, order: 1 };

describe("refineWithUnlabelled", () => {
  it("EM with add-λ estimates never decreases its objective (seeds printed on failure)", () => {
    for (const weight of [0.3, 1, 3]) {
      const config = resolveTrainingConfig({ ...simple, semi: "em", iterations: 6, weight });
      const data = prepareTrainingData(tinyDocuments, config);
      const { model: start } = trainTagger(tinyDocuments, config);
      let previous = objective(start, data.statistics, weight, tinyUnlabelled);
      const { model, history } = refineWithUnlabelled(start, data.statistics, tinyUnlabelled, { method: "em", iterations: 6, weight });
      expect(history).toHaveLength(6);
      // Re-run step by step to check every iteration.
      let current = start;
      for (let n = 0; n < 6; n++) {
        current = refineWithUnlabelled(current, data.statistics, tinyUnlabelled, { method: "em", iterations: 1, weight }).model;
        const value = objective(current, data.statistics, weight, tinyUnlabelled);
        expect(value, `weight ${weight} iteration ${n + 1}`).toBeGreaterThanOrEqual(previous - 1e-9);
        previous = value;
      }
      expect(current.parameters.emissions).toEqual(model.parameters.emissions);
    }
  });

  it("reports log-likelihood, caller-measured seconds and statistics size per iteration", () => {
    let clock = 0;
    const reports: unknown[] = [];
    const { history, model } = trainTagger(tinyDocuments, { semi: "em", iterations: 3 }, { unlabelled: tinyUnlabelled, now: () => (clock += 250), onIteration: (r) => reports.push(r) });
    expect(history).toHaveLength(3);
    expect(reports).toEqual(history);
    for (const r of history) {
      expect(r.method).toBe("em");
      expect(r.seconds).toBe(0.25);
      expect(r.logLikelihood).toBeLessThan(0);
      expect(r.statisticsCells).toBeGreaterThan(0);
      // Expected counts are dense: at least one 8-byte cell per state and symbol.
      expect(r.statisticsBytes).toBeGreaterThanOrEqual(8 * model.statistics.emissions.length);
    }
    expect(model.summary.unlabelledSentences).toBe(4);
    expect(trainTagger(tinyDocuments, { semi: "em", iterations: 1 }, { unlabelled: tinyUnlabelled }).history[0].seconds).toBeNull();
  });

  it("sampling is reproducible for a fixed seed, reports sparse integer statistics, and differs across seeds", () => {
    const run = (seed: number) => trainTagger(tinyDocuments, { semi: "sample", iterations: 3, seed }, { unlabelled: tinyUnlabelled });
    const a = run(5);
    const b = run(5);
    expect(a.model.parameters.emissions, "seed 5").toEqual(b.model.parameters.emissions);
    expect(a.history.map((r) => r.logLikelihood), "seed 5").toEqual(b.history.map((r) => r.logLikelihood));
    for (const r of a.history) {
      expect(r.method).toBe("sample");
      // Sparse: far fewer cells than the dense tables, 16 bytes per non-zero entry.
      expect(r.statisticsBytes).toBe(16 * r.statisticsCells);
      expect(r.statisticsCells).toBeLessThan(a.model.statistics.emissions.length);
    }
    const differs = [6, 7, 8, 9].some((seed) => JSON.stringify(Array.from(run(seed).model.parameters.emissions)) !== JSON.stringify(Array.from(a.model.parameters.emissions)));
    expect(differs).toBe(true);
    const rng = createRng(42);
    const explicit = trainTagger(tinyDocuments, { semi: "sample", iterations: 1 }, { unlabelled: tinyUnlabelled, rng });
    expect(explicit.history).toHaveLength(1);
  });

  it("refuses second-order models", () => {
    expect(() => trainTagger(tinyDocuments, { order: 2, semi: "em", iterations: 1 }, { unlabelled: tinyUnlabelled })).toThrow(/first-order/);
  });
});
