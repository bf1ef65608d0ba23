import { type ResolvedTrainingConfig, type StartRunInput, type TestSplit, trainingConfigDefaults } from "@tagloom/contracts";
import type { TrainingConfig } from "@tagloom/tagger";

/** The form's fields with every omitted one set to its default, the seed and the test split apart. */
export function resolveRunConfig(input: StartRunInput): { config: ResolvedTrainingConfig; seed: number; testSplit: TestSplit } {
  const d = trainingConfigDefaults;
  const config: ResolvedTrainingConfig = {
    smoothing: { ...d.smoothing, ...(input.smoothing ?? {}) } as ResolvedTrainingConfig["smoothing"],
    positionBuckets: input.positionBuckets ?? d.positionBuckets,
    positionStrength: input.positionStrength ?? d.positionStrength,
    rare: input.rare ?? d.rare,
    wordClasses: input.wordClasses ?? d.wordClasses,
    suffixLength: input.suffixLength ?? d.suffixLength,
    order: input.order ?? d.order,
    prevWord: input.prevWord ?? d.prevWord,
    contextEmissions: input.contextEmissions ?? d.contextEmissions,
    crossValidationFolds: input.crossValidationFolds === undefined ? d.crossValidationFolds : input.crossValidationFolds,
    semi: input.semi ?? d.semi,
    iterations: input.iterations ?? d.iterations,
    weight: input.weight ?? d.weight,
    clusters: input.clusters ?? d.clusters,
    perceptron: input.perceptron ?? d.perceptron,
    perceptronFeatures: input.perceptronFeatures ?? d.perceptronFeatures,
  };
  return { config, seed: input.seed ?? d.seed, testSplit: input.testSplit ?? d.testSplit };
}

/** The engine's options for a run (every field the form does not show keeps the engine default). */
export function engineConfigOf(config: ResolvedTrainingConfig, seed: number): Partial<TrainingConfig> {
  return {
    smoothing: config.smoothing,
    positionBuckets: config.positionBuckets,
    positionStrength: config.positionStrength,
    rare: config.rare,
    wordClasses: config.wordClasses,
    suffixLength: config.suffixLength,
    order: config.order,
    prevWord: config.prevWord,
    contextEmissions: config.contextEmissions,
    semi: config.semi,
    iterations: config.iterations,
    weight: config.weight,
    clusters: config.clusters,
    perceptron: config.perceptron,
    perceptronFeatures: config.perceptronFeatures,
    seed,
  };
}

/**
 * Runs with word clusters or perceptron passes train in one piece in the finishing job instead of
 * from summed shard counts: clustering needs the bigrams of the whole text at once, and the
 * perceptron decodes every training sentence with the whole model (the engine's sharded
 * training refuses clusters and has no perceptron). The finishing job holds every training
 * document in memory anyway (calibration, cross-validation), so this costs no more memory.
 */
export function trainsInOnePiece(config: ResolvedTrainingConfig): boolean {
  return config.clusters > 0 || config.perceptron > 0;
}

/** Whether a run reads the corpus's documents without gold. */
export function readsUnlabelled(config: ResolvedTrainingConfig): boolean {
  return config.semi !== "none" || config.clusters > 0;
}
