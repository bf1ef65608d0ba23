import { z } from "zod";

/**
 * A span: character offsets into a document's text (UTF-16 code units, end exclusive) and the
 * name of its entity type. This is the shape of spans everywhere in the API and in JSONL files.
 */
export const spanSchema = z
  .object({
    start: z.number().int().min(0),
    end: z.number().int().min(1),
    type: z.string().min(1).max(50),
  })
  .refine((s) => s.start < s.end, { message: "A span must end after it starts.", path: ["end"] });
export type Span = z.infer<typeof spanSchema>;

/** A span proposed by a tagger or an import, with a confidence in [0, 1]. */
export const suggestedSpanSchema = z
  .object({
    start: z.number().int().min(0),
    end: z.number().int().min(1),
    type: z.string().min(1).max(50),
    confidence: z.number().min(0).max(1),
  })
  .refine((s) => s.start < s.end, { message: "A span must end after it starts.", path: ["end"] });
export type SuggestedSpan = z.infer<typeof suggestedSpanSchema>;

export const spanOrigins = ["human", "suggested"] as const;
export type SpanOrigin = (typeof spanOrigins)[number];

export const documentSplits = ["train", "test"] as const;
export const documentSplitSchema = z.enum(documentSplits);
export type DocumentSplit = z.infer<typeof documentSplitSchema>;

export const annotationStatuses = ["none", "in_progress", "submitted", "gold"] as const;
export type AnnotationStatus = (typeof annotationStatuses)[number];
