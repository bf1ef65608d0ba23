/**
 * Peak memory of training on 1,000,000 labelled tokens with the default configuration, measured
 * in a process of its own so nothing else counts toward the peak. Prints one JSON line.
 */
import { createSyntheticDocuments } from "../src/kernels/synthetic";
import { trainTagger } from "../src/model/tagger";

const tokens = Number(process.argv[2] ?? "1000000");
const documents = createSyntheticDocuments(tokens);
const before = process.resourceUsage().maxRSS * 1024;
const started = process.hrtime.bigint();
const { model } = trainTagger(documents);
const seconds = Number(process.hrtime.bigint() - started) / 1e9;
const peakRssBytes = process.resourceUsage().maxRSS * 1024;
process.stdout.write(
  `${JSON.stringify({ tokens, trainSeconds: seconds, trainTokensPerSecond: Math.round(tokens / seconds), peakRssBytes, rssBeforeTrainingBytes: before, states: model.tags.length, vocabulary: model.vocabulary.words.length })}\n`,
);
