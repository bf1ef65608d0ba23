import { type ColumnDocument, countShard, countShardWords, mergeShardCounts, planShards, serializeModel, statisticsToJson, sumShardStatistics, trainFromShards, trainTagger, tokenizeText, spansToTags } from "@tagloom/tagger";
import { describe, expect, it } from "vitest";
import { generateDocuments } from "./support/training-data";

// Counts are additive (DESIGN.md, "Scale"): shards counted apart and summed must give exactly the
// counts of one pass over all documents, and the same tagger as trainTagger on them.
function columnDocuments(): ColumnDocument[] {
  return generateDocuments(24, 5, 3).map((d) => {
    const { tokens, sentences } = tokenizeText(d.text);
    const tags = spansToTags(tokens, d.spans);
    return { sentences: sentences.map((s) => ({ words: tokens.slice(s.start, s.end).map((t) => d.text.slice(t.start, t.end)), tags: tags.slice(s.start, s.end) })) };
  });
}

const slices = (docs: ColumnDocument[], k: number) => Array.from({ length: k }, (_, i) => docs.slice(Math.floor((i * docs.length) / k), Math.floor(((i + 1) * docs.length) / k)));

describe("sharded counting", () => {
  const docs = columnDocuments();
  const configs = [
    {},
    { order: 2 as const, prevWord: false, contextEmissions: false },
    { positionBuckets: { token: [1, 3], sentence: [1] }, rare: 0, wordClasses: "bikel" as const, suffixLength: 3 },
  ];
  for (const config of configs) {
    it(`summed shard counts equal one shard's, and the tagger equals trainTagger's (${JSON.stringify(config)})`, () => {
      const one = slices(docs, 1);
      const plan1 = planShards(one.map((s) => countShardWords(s)), config);
      const single = countShard(one[0]!, plan1, config);
      for (const k of [2, 5, 24]) {
        const parts = slices(docs, k);
        const plan = planShards(parts.map((s) => countShardWords(s)), config);
        expect(plan).toEqual(plan1);
        const shards = parts.map((s) => countShard(s, plan, config));
        expect(statisticsToJson(sumShardStatistics(shards))).toEqual(single.statistics);
        const expected = JSON.stringify(serializeModel(trainTagger(docs, config).model));
        expect(JSON.stringify(serializeModel(trainFromShards(plan, shards, config, docs).model))).toBe(expected);
        // Folding shards in one at a time (as the finishing job does) gives the same model.
        const folded = shards.reduce((a, b) => mergeShardCounts(a, b));
        expect(folded.statistics).toEqual(single.statistics);
        expect(JSON.stringify(serializeModel(trainFromShards(plan, [folded], config, docs).model))).toBe(expected);
      }
    });
  }
});
