import { z } from "zod";

/**
 * Default colours of entity types, in the order new types receive them: the Okabe–Ito palette
 * (Masataka Okabe and Kei Ito, "Color Universal Design (CUD): How to make figures and
 * presentations that are friendly to colorblind people", 2008, section "A set of colors that is
 * unambiguous both to colorblinds and non-colorblinds"). Its eighth colour, black, is left out:
 * spans are drawn as a fill behind dark text, and black would hide the text.
 */
export const entityTypePalette = ["#E69F00", "#56B4E9", "#009E73", "#F0E442", "#0072B2", "#D55E00", "#CC79A7"] as const;

/** The colour a new type gets: the first palette colour no type uses yet, else the next in turn. */
export function nextEntityTypeColor(usedColors: readonly string[]): string {
  const used = new Set(usedColors.map((c) => c.toUpperCase()));
  const free = entityTypePalette.find((c) => !used.has(c));
  return free ?? entityTypePalette[usedColors.length % entityTypePalette.length]!;
}

export const corpusNameSchema = z
  .string()
  .trim()
  .min(1, "Name the corpus.")
  .max(100, "Use at most 100 characters.");
export const corpusDescriptionSchema = z.string().trim().max(2000, "Use at most 2,000 characters.");

export const createCorpusInputSchema = z.object({
  name: corpusNameSchema,
  description: corpusDescriptionSchema.optional(),
});
export type CreateCorpusInput = z.infer<typeof createCorpusInputSchema>;

export const updateCorpusInputSchema = z
  .object({
    name: corpusNameSchema.optional(),
    description: corpusDescriptionSchema.optional(),
    archived: z.boolean().optional(),
  })
  .refine((v) => v.name !== undefined || v.description !== undefined || v.archived !== undefined, {
    message: "Nothing to change.",
    path: ["name"],
  });
export type UpdateCorpusInput = z.infer<typeof updateCorpusInputSchema>;

export const deleteCorpusInputSchema = z.object({ confirmName: z.string().max(200) });
export type DeleteCorpusInput = z.infer<typeof deleteCorpusInputSchema>;

export const corpusListQuerySchema = z.object({
  cursor: z.string().max(200).optional(),
  limit: z.coerce.number().int().min(1).max(200).default(50),
  archived: z.enum(["true", "false", "all"]).default("false"),
});
export type CorpusListQuery = z.infer<typeof corpusListQuerySchema>;

/** A corpus: a body of documents with one entity schema. */
export type Corpus = {
  id: string;
  name: string;
  description: string;
  archivedAt: string | null;
  createdAt: string;
  updatedAt: string;
};

/** A corpus with the counts its pages show. */
export type CorpusSummary = Corpus & {
  documentCount: number;
  entityTypeCount: number;
};

export type CorpusDetail = CorpusSummary & {
  /** Documents per split (`none` for documents in neither). */
  splits: { train: number; test: number; none: number };
  /** Documents per annotation status. */
  statuses: { none: number; in_progress: number; submitted: number; gold: number };
  /** Files waiting for or in extraction. */
  pendingFiles: number;
};

export const entityTypeNameSchema = z
  .string()
  .trim()
  .regex(/^[A-Z][A-Z0-9_]{0,31}$/, "Use an upper-case identifier: a letter, then letters, digits or _ (at most 32), e.g. PARTY.");
export const entityTypeColorSchema = z
  .string()
  .trim()
  .regex(/^#[0-9a-fA-F]{6}$/, "Use a colour like #E69F00.")
  .transform((c) => c.toUpperCase());
/** One key: a letter or a digit (stored lower-case). */
export const entityTypeHotkeySchema = z
  .string()
  .trim()
  .toLowerCase()
  .regex(/^[a-z0-9]$/, "Use one letter or digit.");
export const entityTypeGuidelineSchema = z.string().max(20_000, "Use at most 20,000 characters.");

export const createEntityTypeInputSchema = z.object({
  name: entityTypeNameSchema,
  color: entityTypeColorSchema.optional(),
  hotkey: entityTypeHotkeySchema.nullable().optional(),
  guideline: entityTypeGuidelineSchema.optional(),
});
export type CreateEntityTypeInput = z.input<typeof createEntityTypeInputSchema>;

export const updateEntityTypeInputSchema = z
  .object({
    name: entityTypeNameSchema.optional(),
    color: entityTypeColorSchema.optional(),
    hotkey: entityTypeHotkeySchema.nullable().optional(),
    guideline: entityTypeGuidelineSchema.optional(),
    position: z.number().int().min(0).max(10_000).optional(),
  })
  .refine((v) => Object.values(v).some((x) => x !== undefined), { message: "Nothing to change.", path: ["name"] });
export type UpdateEntityTypeInput = z.input<typeof updateEntityTypeInputSchema>;

/** Deleting a type that has spans needs `confirm: true` (the first answer is 409 with the count). */
export const deleteEntityTypeInputSchema = z.object({ confirm: z.boolean().optional() });

/** An entity type of a corpus's schema. Spans refer to it by id, so renaming keeps them. */
export type EntityType = {
  id: string;
  name: string;
  color: string;
  hotkey: string | null;
  guideline: string;
  position: number;
};

/** Details of the 409 answered when a deleted type still has spans. */
export type EntityTypeInUse = { spanCount: number; documentCount: number; byStore: Record<string, number> };
