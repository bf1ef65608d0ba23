import { z } from "zod";

/**
 * The engine's defaults for every field of the training form, mirrored from
 * `DEFAULT_TRAINING_CONFIG` of @tagloom/tagger (the settings its 5-fold cross-validation chose);
 * apps/api/test/training-defaults.test.ts fails when the two drift apart. The contracts package
 * stays free of the engine so the web bundle does not carry it. `crossValidationFolds` and
 * `testSplit` are options of a run, not of the engine. `perceptronFeatures` differs on purpose: a
 * run's perceptron (off unless given passes) works over word and neighbour features, which gained
 * on informal text (packages/tagger/README.md, "Neighbour features"), while the engine keeps its
 * older per-symbol weights as the command line's default.
 */
export const perceptronFeatureNames = ["symbol", "word-type", "neighbours"] as const;
export type PerceptronFeatures = (typeof perceptronFeatureNames)[number];
export const perceptronFeaturesSchema = z.enum(perceptronFeatureNames, "Choose symbol, word-type or neighbours.");
/** How the run form and a run's settings name each kind of perceptron weights. */
export const perceptronFeatureLabels: Record<PerceptronFeatures, string> = {
  symbol: "Per word",
  "word-type": "Word features",
  neighbours: "Word and neighbour features",
};

export const trainingConfigDefaults = {
  smoothing: { start: 0.1, transition: 0.1, emission: 0.01 },
  positionBuckets: { token: [] as number[], sentence: [] as number[] },
  positionStrength: 10,
  rare: 4,
  wordClasses: "informal" as "none" | "bikel" | "extended" | "informal",
  suffixLength: 6,
  order: 1 as 1 | 2,
  prevWord: true,
  contextEmissions: true,
  semi: "none" as "none" | "em" | "sample",
  iterations: 5,
  weight: 0.1,
  seed: 1,
  clusters: 0,
  perceptron: 0,
  /** What the perceptron's weights are over (when it has passes): the neighbour features gained on informal text. */
  perceptronFeatures: "neighbours" as PerceptronFeatures,
  crossValidationFolds: 5 as number | null,
  testSplit: { kind: "corpus" } as TestSplit,
};

const lambda = z.number().finite("Enter a number.").min(0, "Use a value of 0 or more.").max(1000, "Use at most 1000.");
const boundaries = z
  .array(z.number().int("Use whole numbers.").min(1, "Boundaries start at 1.").max(10_000, "Use at most 10,000."))
  .max(20, "Use at most 20 boundaries.")
  .refine((list) => list.every((b, i) => i === 0 || b > list[i - 1]!), "Boundaries must increase, e.g. 1, 2, 4.");

/** Which documents a run tests on: the corpus's `test` documents, or a seeded random hold-out. */
export const testSplitSchema = z.discriminatedUnion("kind", [
  z.strictObject({ kind: z.literal("corpus") }),
  z.strictObject({
    kind: z.literal("holdout"),
    percent: z.number().int("Use a whole percentage.").min(1, "Hold out at least 1 %.").max(90, "Hold out at most 90 %."),
  }),
]);
export type TestSplit = z.infer<typeof testSplitSchema>;

/**
 * Every field of the training form, all optional: an omitted field (or an empty body) takes the
 * engine's default from `trainingConfigDefaults`.
 */
export const trainingConfigInputSchema = z.strictObject({
  /** Add-λ (Lidstone) constant per distribution. */
  smoothing: z.strictObject({ start: lambda.optional(), transition: lambda.optional(), emission: lambda.optional() }).optional(),
  /** Position-aware transitions: empty lists switch them off. */
  positionBuckets: z.strictObject({ token: boundaries, sentence: boundaries }).optional(),
  /** Pull of each position bucket toward the position-free transitions (pseudo-tokens). */
  positionStrength: z.number().finite("Enter a number.").min(0, "Use 0 or more.").max(100_000, "Use at most 100,000.").optional(),
  /** Words seen at most this often are modelled through their word class. */
  rare: z.number().int("Use a whole number.").min(0, "Use 0 or more.").max(1000, "Use at most 1000.").optional(),
  wordClasses: z.enum(["none", "bikel", "extended", "informal"], "Choose none, bikel, extended or informal.").optional(),
  /** Longest suffix used for unknown words; 0 switches suffixes off. */
  suffixLength: z.number().int("Use a whole number.").min(0, "Use 0 or more.").max(10, "Use at most 10.").optional(),
  order: z.union([z.literal(1), z.literal(2)], "Choose 1 or 2.").optional(),
  /** Transitions also conditioned on the previous word. */
  prevWord: z.boolean("Choose on or off.").optional(),
  /** Emissions conditioned on the previous state or word. */
  contextEmissions: z.boolean("Choose on or off.").optional(),
  /** k-fold cross-validation over the training documents; null switches it off. */
  crossValidationFolds: z.number().int("Use a whole number.").min(2, "Use at least 2 folds.").max(10, "Use at most 10 folds.").nullable().optional(),
  /** Learning from the corpus's documents without gold after supervised training. */
  semi: z.enum(["none", "em", "sample"], "Choose none, em or sample.").optional(),
  iterations: z.number().int("Use a whole number.").min(0, "Use 0 or more.").max(50, "Use at most 50.").optional(),
  /** Weight of the unlabelled counts relative to the labelled ones. */
  weight: z.number().finite("Enter a number.").min(0, "Use 0 or more.").max(10, "Use at most 10.").optional(),
  testSplit: testSplitSchema.optional(),
  seed: z.number().int("Use a whole number.").min(0, "Use 0 or more.").max(2_147_483_647, "Use at most 2147483647.").optional(),
  /** Word clusters learnt from the training text and the corpus's documents without gold; 0 = off. */
  clusters: z.number("Enter a number.").int("Use a whole number of clusters.").min(0, "Use 0 clusters (off) or more.").max(1000, "Use at most 1000 clusters.").optional(),
  /** Averaged-perceptron passes over the training documents; 0 = off. */
  perceptron: z.number("Enter a number.").int("Use a whole number of passes.").min(0, "Use 0 passes (off) or more.").max(20, "Use at most 20 passes.").optional(),
  /** Weights per word (symbol), per feature of the word (word-type) or also of its neighbours (neighbours). */
  perceptronFeatures: perceptronFeaturesSchema.optional(),
}).superRefine((v, ctx) => {
  // The engine's EM and sampling are first-order only.
  if (v.order === 2 && v.semi !== undefined && v.semi !== "none") {
    ctx.addIssue({ code: "custom", path: ["semi"], message: "Learning from unlabelled documents needs model order 1." });
  }
  // So is its perceptron over symbols (it reweighs first-order emission scores); the feature
  // perceptrons work with either order.
  if (v.order === 2 && v.perceptron !== undefined && v.perceptron > 0 && v.perceptronFeatures === "symbol") {
    ctx.addIssue({ code: "custom", path: ["perceptronFeatures"], message: "Weights per word need model order 1; choose word or neighbour features." });
  }
});
export type TrainingConfigInput = z.infer<typeof trainingConfigInputSchema>;

/** POST /runs body: the form's fields; `{}` trains with the defaults. */
export const startRunInputSchema = trainingConfigInputSchema;
export type StartRunInput = z.infer<typeof startRunInputSchema>;

export const runStatusNames = ["queued", "running", "succeeded", "failed", "cancelled"] as const;
export const runStatusSchema = z.enum(runStatusNames);
export type RunStatus = z.infer<typeof runStatusSchema>;
/** The one place the words for run states live (web badges, e-mails, audit details). */
export const runStatusLabels: Record<RunStatus, string> = {
  queued: "Waiting for a worker",
  running: "Training",
  succeeded: "Finished",
  failed: "Failed",
  cancelled: "Cancelled",
};
/** States a run never leaves. */
export const finishedRunStatuses: readonly RunStatus[] = ["succeeded", "failed", "cancelled"];

export const runStageNames = ["loading", "counting", "smoothing", "unlabelled", "cross_validation", "evaluation", "storing"] as const;
export const runStageSchema = z.enum(runStageNames);
export type RunStage = z.infer<typeof runStageSchema>;
export const runStageLabels: Record<RunStage, string> = {
  loading: "Loading gold documents",
  counting: "Counting",
  smoothing: "Smoothing",
  unlabelled: "Learning from unlabelled documents",
  cross_validation: "Cross-validating",
  evaluation: "Evaluating on the test split",
  storing: "Storing the tagger",
};

/** One pass over the unlabelled documents (EM or sampling). */
export const runIterationSchema = z.object({
  iteration: z.number().int(),
  /** Σ ln P(unlabelled sentence) under the model the pass started from. */
  logLikelihood: z.number(),
  seconds: z.number(),
  /** Bytes of statistics the pass held: dense for EM, sparse for sampling. */
  statisticsBytes: z.number().int(),
});
export type RunIteration = z.infer<typeof runIterationSchema>;

const prfSchema = z.object({ precision: z.number(), recall: z.number(), f1: z.number() });
const spreadSchema = z.object({ mean: z.number(), std: z.number() });

/** A tagger's scores on its run's test split (CoNLL convention, fractions in [0, 1]). */
export const evaluationSchema = z.object({
  overall: prfSchema.extend({ correct: z.number().int(), predicted: z.number().int(), gold: z.number().int() }),
  /** Per entity type seen in gold or predicted, sorted by name (the engine's order); support = gold entities of the type. */
  types: z.array(prfSchema.extend({ type: z.string(), support: z.number().int(), correct: z.number().int(), predicted: z.number().int() })),
  tokenAccuracy: z.number(),
  tokens: z.number().int(),
  sentences: z.number().int(),
  documents: z.number().int(),
  /**
   * Token-level confusion between types: counts[g][p] = tokens of gold type g tagged as type p;
   * missed[g] = tokens of gold type g tagged as no entity; spurious[p] = tokens outside every
   * gold entity tagged as type p.
   */
  confusion: z.object({
    types: z.array(z.string()),
    counts: z.array(z.array(z.number().int())),
    missed: z.array(z.number().int()),
    spurious: z.array(z.number().int()),
  }),
  /** k-fold cross-validation over the training documents; null when switched off. */
  crossValidation: z
    .object({
      folds: z.number().int(),
      unit: z.enum(["documents", "sentence-blocks"]),
      f1: spreadSchema,
      precision: spreadSchema,
      recall: spreadSchema,
      tokenAccuracy: spreadSchema,
      perFold: z.array(z.object({ f1: z.number(), precision: z.number(), recall: z.number(), tokenAccuracy: z.number(), tokens: z.number().int() })),
    })
    .nullable(),
  /** Test scores when trained on nested random subsets of 10, 25, 50 and 100 % of the training documents. */
  learningCurve: z.array(
    z.object({ fraction: z.number(), documents: z.number().int(), tokens: z.number().int(), f1: z.number(), precision: z.number(), recall: z.number(), tokenAccuracy: z.number() }),
  ),
  /** EM or sampling passes; null for supervised runs. */
  semiSupervised: z.object({ method: z.enum(["em", "sample"]), iterations: z.array(runIterationSchema) }).nullable(),
});
export type Evaluation = z.infer<typeof evaluationSchema>;

export const documentCountsSchema = z.object({
  train: z.number().int(),
  test: z.number().int(),
  unlabelled: z.number().int(),
  /**
   * Documents without gold a run did not read because those it read already reached the
   * service's token limit for them; absent when none were left out.
   */
  unlabelledLeftOut: z.number().int().optional(),
  /** Tokens of the documents without gold the run reads; absent for runs that read none or predate it. */
  unlabelledTokens: z.number().int().optional(),
});

/** The config a run trained with: every form field resolved to a value. */
export const resolvedTrainingConfigSchema = z.object({
  smoothing: z.object({ start: z.number(), transition: z.number(), emission: z.number() }),
  positionBuckets: z.object({ token: z.array(z.number().int()), sentence: z.array(z.number().int()) }),
  positionStrength: z.number(),
  rare: z.number().int(),
  wordClasses: z.enum(["none", "bikel", "extended", "informal"]),
  suffixLength: z.number().int(),
  order: z.union([z.literal(1), z.literal(2)]),
  prevWord: z.boolean(),
  contextEmissions: z.boolean(),
  crossValidationFolds: z.number().int().nullable(),
  semi: z.enum(["none", "em", "sample"]),
  iterations: z.number().int(),
  weight: z.number(),
  /** 0 for runs recorded before word clusters existed. */
  clusters: z.number().int(),
  /** 0 for runs recorded before the perceptron option existed. */
  perceptron: z.number().int(),
  /** "symbol" for runs recorded before the feature perceptrons existed. */
  perceptronFeatures: perceptronFeaturesSchema,
});
export type ResolvedTrainingConfig = z.infer<typeof resolvedTrainingConfigSchema>;

export const trainingRunSchema = z.object({
  id: z.string(),
  corpusId: z.string(),
  /** 1, 2, … within the corpus ("Run 4"). */
  number: z.number().int(),
  status: runStatusSchema,
  /** The stage in progress or last reached; null while waiting for a worker. */
  stage: runStageSchema.nullable(),
  /** 0..1 */
  progress: z.number(),
  cancelRequested: z.boolean(),
  iterations: z.array(runIterationSchema),
  /** Why the run failed, in a sentence a data lead understands; null otherwise. */
  error: z.string().nullable(),
  config: resolvedTrainingConfigSchema,
  seed: z.number().int(),
  testSplit: testSplitSchema,
  documentCounts: documentCountsSchema,
  shardCount: z.number().int(),
  taggerId: z.string().nullable(),
  evaluation: evaluationSchema.nullable(),
  repeatOfRunId: z.string().nullable(),
  createdAt: z.string(),
  startedAt: z.string().nullable(),
  finishedAt: z.string().nullable(),
  createdBy: z.string().nullable(),
});
export type TrainingRun = z.infer<typeof trainingRunSchema>;

export const taggerSchema = z.object({
  id: z.string(),
  corpusId: z.string(),
  /** 1, 2, … within the corpus. */
  version: z.number().int(),
  /** null for a tagger not made by a run (test fixtures). */
  runId: z.string().nullable(),
  createdAt: z.string(),
  /** "Tagger v3 of <corpus name>" */
  label: z.string(),
  evaluation: evaluationSchema,
});
export type Tagger = z.infer<typeof taggerSchema>;

/** The name a tagger goes by everywhere. */
export function taggerLabel(version: number, corpusName: string): string {
  return `Tagger v${version} of ${corpusName}`;
}

export const runListQuerySchema = z.object({
  cursor: z.string().max(200).optional(),
  limit: z.coerce.number().int().min(1).max(100).default(20),
});
export type RunListQuery = z.infer<typeof runListQuerySchema>;
export const taggerListQuerySchema = runListQuerySchema;
export type TaggerListQuery = RunListQuery;

const sideSchema = prfSchema.extend({ support: z.number().int() });

/** Two taggers of one corpus scored on the same test documents (tagger A's run's test split, shared with B's). */
export const comparisonSchema = z.object({
  a: z.object({ id: z.string(), label: z.string(), version: z.number().int() }),
  b: z.object({ id: z.string(), label: z.string(), version: z.number().int() }),
  testDocuments: z.number().int(),
  overall: z.object({ a: sideSchema, b: sideSchema, f1Difference: z.number() }),
  /** f1Difference = F1(B) − F1(A) */
  types: z.array(z.object({ type: z.string(), a: sideSchema, b: sideSchema, f1Difference: z.number() })),
  /**
   * Paired bootstrap over test documents (Berg-Kirkpatrick, Burkett & Klein 2012): interval of
   * F1(B) − F1(A) and the p-value of "B is better"; null with fewer than 2 test documents.
   */
  bootstrap: z
    .object({ delta: z.number(), ci: z.tuple([z.number(), z.number()]), confidence: z.number(), pValue: z.number(), samples: z.number().int() })
    .nullable(),
  /** Test documents where A and B disagree most (tokens with different tags), most first. */
  disagreements: z.array(
    z.object({ documentId: z.string(), title: z.string(), tokensDiffering: z.number().int(), tokens: z.number().int(), f1A: z.number(), f1B: z.number() }),
  ),
});
export type TaggerComparison = z.infer<typeof comparisonSchema>;

/** A span of the read-only comparison view: character offsets (end exclusive) and the type's name. */
export const comparisonSpanSchema = z.object({ start: z.number().int().min(0), end: z.number().int().min(0), type: z.string() });
export type ComparisonSpan = z.infer<typeof comparisonSpanSchema>;

/** One test document with gold, tagger A's and tagger B's spans over the same text. */
export const comparisonDocumentSchema = z.object({
  document: z.object({ id: z.string(), title: z.string(), text: z.string() }),
  entityTypes: z.array(z.object({ name: z.string(), color: z.string() })),
  gold: z.array(comparisonSpanSchema),
  a: z.array(comparisonSpanSchema),
  b: z.array(comparisonSpanSchema),
});
export type ComparisonDocument = z.infer<typeof comparisonDocumentSchema>;
