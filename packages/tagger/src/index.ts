// Public surface of @tagloom/tagger. Anything not exported here is internal.
export * from "./util/random";
// -- text, encoding, column files and metrics (exports below this line) --
export { splitSentences, tokenizeText, tokenizeWords, type Token, type TokenizedText } from "./text/tokens";
export { chunksToTags, isIobTag, spansToTags, tagsToChunks, tagsToSpans, toIob2, type CharSpan, type Chunk } from "./text/bio";
export { ColumnFormatError, formatTaggedSentences, parseColumnText, type ColumnDocument, type TaggedSentence, type TagScheme } from "./text/conll";
export * from "./metrics";
// -- model, decoding, training, serialization (exports below this line) --
export { trainTagger, tagSentence, tagDocument, type TrainOptions, type TaggedChunk, type TaggedSentenceResult } from "./model/tagger";
export type { TaggerModel, DataSummary } from "./model/tagger-model";
export { DEFAULT_TRAINING_CONFIG, resolveTrainingConfig, type TrainingConfig, type SmoothingConfig, type TransitionPrior } from "./estimation/training-config";
export { documentUncertainty, uncertaintyMeasures, type DocumentUncertainty, type UncertaintyMeasures } from "./model/uncertainty";
export { serializeModel, loadModel, ModelFormatError, MODEL_FORMAT, MODEL_SCHEMA_VERSION, type SerializedModel } from "./model/serialize";
export { evaluateModel, type Evaluation } from "./evaluation/evaluation";
export { crossValidate, planFolds, type CrossValidationResult, type FoldScore, type FoldUnit } from "./evaluation/cross-validation";
export { refineWithUnlabelled, type IterationReport, type RefineOptions } from "./semi-supervised/semi-supervised";
export { nltkCompatibleConfig } from "./estimation/nltk-compatible";
export { parsePositionBuckets, formatPositionBuckets, type PositionBuckets } from "./estimation/position-buckets";
export { decodeSentence, sentencePosteriors, sentenceLogLikelihood } from "./model/decode";
export { chunkConfidences } from "./model/span-confidence";
export { applyPlatt, fitPlatt, type PlattCalibration } from "./estimation/platt";
export { decodeViterbi, createViterbiWorkspace, type ViterbiWorkspace } from "./kernels/viterbi";
export { computeForward } from "./kernels/forward";
export { computeBackward } from "./kernels/backward";
export { computePosteriors, accumulateTransitionPosteriors, type Posteriors, type PosteriorBuffers } from "./kernels/forward-backward";
export { decodeViterbiSecondOrder } from "./kernels/viterbi-second-order";
export { computeForwardSecondOrder } from "./kernels/forward-second-order";
export { computePosteriorsSecondOrder } from "./kernels/forward-backward-second-order";
export type { SecondOrderLattice } from "./kernels/second-order-lattice";
export { sampleStatePath } from "./kernels/sampling";
export { trainBaumWelch, computeExpectedCounts, maximizeExpectedCounts, type ExpectedCounts } from "./semi-supervised/em";
export { createHmmFromProbabilities, gatherInput, type HmmParams, type EmissionInput } from "./kernels/hmm-params";
export { createTransitionCache, type TransitionCache } from "./kernels/transition-cache";
export { logSumExp, logAddExp } from "./util/math";
export { countSupervised, type EncodedCorpus } from "./estimation/train";
export { addStatistics, type SufficientStatistics } from "./estimation/sufficient-statistics";
export { wordClassNames, wordClassOf, type WordClassScheme } from "./estimation/word-features";
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
} from "./estimation/shard-training";
