import { z } from "zod";
import { defineJob } from "@/jobs/registry";
import { SUGGEST_QUEUE, runSuggestionShard } from "./suggestions.service";

const payloadSchema = z.object({
  organizationId: z.uuid(),
  corpusId: z.uuid(),
  taggerId: z.uuid(),
  runId: z.uuid(),
  documentIds: z.array(z.uuid()).min(1).max(1000),
});

/** Tags one shard of a corpus's documents with its suggester. */
export const suggestShardJob = defineJob({
  queue: SUGGEST_QUEUE,
  // Tagging is CPU-bound: one shard at a time per process; more workers, more shards at once.
  concurrency: 1,
  handle: async (data) => runSuggestionShard(payloadSchema.parse(data)),
});
