import { z } from "zod";

// Organization API tokens, the tagging API for pipelines (/api/v1), the corpus's suggester and
// the "most uncertain" ranking of documents without gold.

export const createApiTokenInputSchema = z.object({
  name: z.string().trim().min(1, "Name the token, e.g. after the pipeline that uses it.").max(100, "Use at most 100 characters."),
});
export type CreateApiTokenInput = z.infer<typeof createApiTokenInputSchema>;

/** A token as listed: never the secret. */
export type ApiToken = {
  id: string;
  name: string;
  /** The first characters of the secret, for recognising it. */
  prefix: string;
  createdAt: string;
  lastUsedAt: string | null;
  revokedAt: string | null;
  createdBy: string | null;
};

/** The answer to creating a token: the secret appears here once and never again. */
export type CreatedApiToken = { id: string; name: string; prefix: string; token: string; createdAt: string };

/** Limits of one tagging request (the API says them in its error when a request exceeds them). */
export const taggingLimits = { maxTexts: 100, maxCharsPerText: 50_000, maxTotalChars: 500_000 } as const;

/** Body of POST /api/v1/corpora/:corpusId/tag: exactly one of `text` or `texts`. */
export const tagRequestSchema = z
  .object({
    text: z.string().optional(),
    texts: z.array(z.string()).min(1, "Give at least one text.").optional(),
  })
  .strict()
  .refine((v) => (v.text === undefined) !== (v.texts === undefined), { message: 'Give either "text" or "texts", not both.', path: ["text"] });
export type TagRequest = z.infer<typeof tagRequestSchema>;

/** One entity the tagger found: UTF-16 offsets of the given text (end exclusive). */
export type TaggedSpan = { start: number; end: number; type: string; text: string; confidence: number };
/** Response of the tagging API (a stable interface). */
export type TagResponse = { tagger: { id: string; version: number }; results: Array<{ spans: TaggedSpan[] }> };

export const setSuggesterInputSchema = z.object({ taggerId: z.uuid("Pick a tagger of this corpus.").nullable() });
export type SetSuggesterInput = z.infer<typeof setSuggesterInputSchema>;

/** Progress of the suggestion job of the current suggester (or of new documents). */
export type SuggestionRun = {
  id: string;
  taggerId: string;
  reason: "suggester_changed" | "new_documents";
  shardsTotal: number;
  shardsDone: number;
  documentsTotal: number;
  documentsDone: number;
  spansSuggested: number;
  createdAt: string;
  finishedAt: string | null;
};

/** How annotators judged the suggester's suggestions: precision = accepted / (accepted + rejected). */
export type SuggesterJudgement = { accepted: number; rejected: number; precision: number | null };

/** A tagger of the corpus that can be picked as its suggester. */
export type SuggesterCandidate = { id: string; version: number; name: string; createdAt: string; f1: number | null };

export type SuggesterStatus = {
  tagger: { id: string; version: number; name: string } | null;
  /** The corpus's finished taggers, newest first. */
  candidates: SuggesterCandidate[];
  changedAt: string | null;
  runs: SuggestionRun[];
  judgement: SuggesterJudgement;
};

export const uncertainQuerySchema = z.object({
  limit: z.coerce.number().int().min(1).max(500).default(50),
  /** Confidence under which a suggested span counts as low-confidence in the reason. */
  threshold: z.coerce.number().min(0).max(1).default(0.6),
});
export type UncertainQuery = z.infer<typeof uncertainQuerySchema>;

/** One document of the "most uncertain" ranking. */
export type UncertainDocument = {
  id: string;
  title: string;
  tokenCount: number;
  /** Mean token entropy of the posterior marginals, in nats (the ranking key). */
  score: number;
  leastConfidence: number;
  lowConfidenceSpans: number;
  spans: number;
  reason: string;
};

export type UncertainRanking = {
  tagger: { id: string; version: number };
  measure: "mean_token_entropy";
  threshold: number;
  /** Documents without gold considered (all of them, ranked; `items` is the top `limit`). */
  considered: number;
  items: UncertainDocument[];
};
