// Public surface of @tagloom/tagger. Anything not exported here is internal.
export * from "./random";
// -- text, encoding, column files and metrics (exports below this line) --
export { splitSentences, tokenizeText, tokenizeWords, type Token, type TokenizedText } from "./tokens";
export { chunksToTags, isIobTag, spansToTags, tagsToChunks, tagsToSpans, toIob2, type CharSpan, type Chunk } from "./bio";
export { ColumnFormatError, formatTaggedSentences, parseColumnText, type ColumnDocument, type TaggedSentence, type TagScheme } from "./conll";
export * from "./metrics";
// -- model, decoding, training, serialization (exports below this line) --
export { trainTagger, tagSentence, tagDocument, type TrainOptions, type TaggedChunk, type TaggedSentenceResult } from "./tagger";
export type { TaggerModel, DataSummary } from "./tagger-model";
export { DEFAULT_TRAINING_CONFIG, resolveTrainingConfig, type TrainingConfig, type SmoothingConfig, type TransitionPrior } from "./training-config";
export { documentUncertainty, type DocumentUncertainty } from "./uncertainty";
export { serializeModel, loadModel, ModelFormatError, MODEL_FORMAT, MODEL_SCHEMA_VERSION, type SerializedModel } from "./serialize";
export { evaluateModel, type Evaluation } from "./evaluation";
export { crossValidate, planFolds, type CrossValidationResult, type FoldScore, type FoldUnit } from "./cross-validation";
export { refineWithUnlabelled, type IterationReport, type RefineOptions } from "./semi-supervised";
export { nltkCompatibleConfig } from "./nltk-compatible";
export { parsePositionBuckets, formatPositionBuckets, type PositionBuckets } from "./position-buckets";
export { decodeSentence, sentencePosteriors, sentenceLogLikelihood } from "./decode";
export { chunkConfidences } from "./span-confidence";
export { decodeViterbi, createViterbiWorkspace, type ViterbiWorkspace } from "./viterbi";
export { computeForward } from "./forward";
export { computeBackward } from "./backward";
export { computePosteriors, accumulateTransitionPosteriors, type Posteriors, type PosteriorBuffers } from "./forward-backward";
export { decodeViterbiSecondOrder } from "./viterbi-second-order";
export { computeForwardSecondOrder } from "./forward-second-order";
export { computePosteriorsSecondOrder } from "./forward-backward-second-order";
export type { SecondOrderLattice } from "./second-order-lattice";
export { sampleStatePath } from "./sampling";
export { trainBaumWelch, computeExpectedCounts, maximizeExpectedCounts, type ExpectedCounts } from "./em";
export { createHmmFromProbabilities, gatherInput, type HmmParams, type EmissionInput } from "./hmm-params";
export { createTransitionCache, type TransitionCache } from "./transition-cache";
export { logSumExp, logAddExp } from "./math";
export { countSupervised, type EncodedCorpus } from "./train";
export { addStatistics, type SufficientStatistics } from "./sufficient-statistics";
export { wordClassNames, wordClassOf, type WordClassScheme } from "./word-features";
export {
  countShardWords,
  planShards,
  countShard,
  sumShardStatistics,
  mergeShardCounts,
  trainFromShards,
  statisticsToJson,
  statisticsFromJson,
  type ShardWordCounts,
  type ShardPlan,
  type ShardCounts,
  type SerializedStatistics,
} from "./shard-training";
