import { z } from "zod";
import type { EntityType } from "./corpora";
import type { DocumentTokens } from "./documents";
import { type Span, type SuggestedSpan, spanOrigins, spanSchema } from "./spans";

export const assignmentStates = ["open", "in_progress", "submitted", "accepted", "returned"] as const;
export const assignmentStateSchema = z.enum(assignmentStates);
export type AssignmentState = z.infer<typeof assignmentStateSchema>;

/** States in which the annotator may still change the spans. */
export const editableAssignmentStates: readonly AssignmentState[] = ["open", "in_progress", "returned"];

/** The largest number of spans one document may hold (common practice: far above any real need). */
export const MAX_SPANS_PER_DOCUMENT = 20_000;

/** A span of an annotator, with where it came from (typed by hand or an accepted suggestion). */
export const annotatedSpanSchema = z
  .object({
    start: z.number().int().min(0),
    end: z.number().int().min(1),
    type: z.string().min(1).max(50),
    origin: z.enum(spanOrigins).default("human"),
  })
  .refine((s) => s.start < s.end, { message: "A span must end after it starts.", path: ["end"] });
export type AnnotatedSpan = z.output<typeof annotatedSpanSchema>;

/** A calendar day, YYYY-MM-DD. */
export const calendarDateSchema = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, "Use a date like 2027-03-31.")
  .refine((v) => {
    const d = new Date(`${v}T00:00:00Z`);
    return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === v;
  }, "That day does not exist.");

const userIdSchema = z.string().min(1).max(100);

const uniqueList = <T extends z.ZodType<string>>(item: T, what: string) =>
  z.array(item).refine((xs) => new Set(xs).size === xs.length, `Each ${what} may appear only once.`);

export const batchAssignmentModes = ["round_robin", "by_hand"] as const;

/**
 * A new batch: its documents, and who annotates each one. Round robin gives every document k
 * annotators taken in turn from the list (k ≥ 2 gives overlap for agreement); by hand names
 * them per document.
 */
export const createBatchInputSchema = z
  .object({
    name: z.string().trim().min(1, "Name the batch.").max(100, "Use at most 100 characters."),
    dueDate: calendarDateSchema.nullable().default(null),
    documentIds: uniqueList(z.uuid("Not a document id."), "document").min(1, "Pick at least one document.").max(2000, "A batch holds at most 2000 documents."),
    assignment: z.discriminatedUnion("mode", [
      z.object({
        mode: z.literal("round_robin"),
        annotatorIds: uniqueList(userIdSchema, "annotator").min(1, "Pick at least one annotator.").max(200),
        annotatorsPerDocument: z.number().int().min(1, "Each document needs at least one annotator.").max(10, "Use at most 10 annotators per document."),
      }),
      z.object({
        mode: z.literal("by_hand"),
        documents: z
          .array(z.object({ documentId: z.uuid("Not a document id."), annotatorIds: uniqueList(userIdSchema, "annotator").min(1, "Give each document at least one annotator.").max(10) }))
          .max(2000),
      }),
    ]),
  })
  .superRefine((v, ctx) => {
    if (v.assignment.mode === "round_robin") {
      if (v.assignment.annotatorsPerDocument > v.assignment.annotatorIds.length) {
        ctx.addIssue({
          code: "custom",
          path: ["assignment", "annotatorsPerDocument"],
          message: `Only ${v.assignment.annotatorIds.length} annotator(s) picked; a document cannot go to ${v.assignment.annotatorsPerDocument} different people.`,
        });
      }
      return;
    }
    const named = new Set(v.assignment.documents.map((d) => d.documentId));
    const missing = v.documentIds.filter((id) => !named.has(id));
    const extra = [...named].filter((id) => !v.documentIds.includes(id));
    if (missing.length || extra.length || named.size !== v.assignment.documents.length) {
      ctx.addIssue({ code: "custom", path: ["assignment", "documents"], message: "Name the annotators of every picked document exactly once." });
    }
  });
export type CreateBatchInput = z.input<typeof createBatchInputSchema>;
export type CreateBatchParsed = z.output<typeof createBatchInputSchema>;

/** Counts of assignments by state. */
export type AssignmentCounts = Record<AssignmentState, number> & { total: number };

export type BatchSummary = {
  id: string;
  corpusId: string;
  name: string;
  dueDate: string | null;
  annotatorsPerDocument: number;
  documentCount: number;
  createdAt: string;
  createdBy: string | null;
  assignments: AssignmentCounts;
  /** Documents whose assignments in this batch are all accepted (their gold is settled). */
  documentsSettled: number;
};

export type BatchAnnotatorProgress = { userId: string; name: string; email: string; assignments: AssignmentCounts };

export type BatchDocumentRow = {
  documentId: string;
  title: string;
  tokenCount: number;
  assignments: Array<{ id: string; annotatorId: string; annotatorName: string; state: AssignmentState }>;
};

export type BatchDetail = BatchSummary & { annotators: BatchAnnotatorProgress[]; documents: BatchDocumentRow[] };

export type QueueItem = {
  assignmentId: string;
  corpusId: string;
  corpusName: string;
  batchId: string;
  batchName: string;
  dueDate: string | null;
  documentId: string;
  documentTitle: string;
  tokenCount: number;
  state: AssignmentState;
  reviewComment: string | null;
  updatedAt: string;
};
/** My unfinished assignments in the organization, the one to do next first, and my finished ones (latest first, at most 50). */
export type Queue = { items: QueueItem[]; next: QueueItem | null; done: QueueItem[] };

export type AnnotationDocument = { id: string; title: string; text: string; tokens: DocumentTokens };

/** Everything the workspace needs to annotate one assignment. */
export type AssignmentView = {
  id: string;
  corpusId: string;
  batch: { id: string; name: string; dueDate: string | null };
  annotator: { userId: string; name: string };
  state: AssignmentState;
  version: number;
  /** True when the signed-in member may change the spans (the assignee, while not submitted). */
  canEdit: boolean;
  reviewComment: string | null;
  updatedAt: string;
  document: AnnotationDocument;
  entityTypes: EntityType[];
  spans: AnnotatedSpan[];
  /** The document's suggestions the annotator has neither dismissed nor turned into a span. */
  suggestions: SuggestedSpan[];
  dismissedSuggestions: Span[];
};

export const saveAssignmentInputSchema = z.object({
  version: z.number().int().min(0),
  spans: z.array(annotatedSpanSchema).max(MAX_SPANS_PER_DOCUMENT, `A document holds at most ${MAX_SPANS_PER_DOCUMENT} spans.`),
  dismissedSuggestions: z.array(spanSchema).max(MAX_SPANS_PER_DOCUMENT).default([]),
});
export type SaveAssignmentInput = z.input<typeof saveAssignmentInputSchema>;

export type SaveAssignmentResult = { version: number; state: AssignmentState; updatedAt: string };

/** `details` of the 409 a stale save gets: what the server holds now. */
export type StaleVersionDetails = { version: number; state: AssignmentState; spans: AnnotatedSpan[]; dismissedSuggestions: Span[] };

export const submitAssignmentInputSchema = z.object({ version: z.number().int().min(0) });

export const returnAssignmentInputSchema = z.object({
  comment: z.string().trim().min(1, "Say what needs fixing.").max(2000, "Use at most 2000 characters."),
});
export type ReturnAssignmentInput = z.infer<typeof returnAssignmentInputSchema>;

export const settleDocumentInputSchema = z.object({
  spans: z.array(spanSchema).max(MAX_SPANS_PER_DOCUMENT, `A document holds at most ${MAX_SPANS_PER_DOCUMENT} spans.`),
});
export type SettleDocumentInput = z.infer<typeof settleDocumentInputSchema>;

export type ReviewListItem = {
  corpusId: string;
  batchId: string;
  batchName: string;
  documentId: string;
  documentTitle: string;
  assignments: Array<{ id: string; annotatorId: string; annotatorName: string; state: AssignmentState; submittedAt: string | null }>;
  /** Every assignment of the document in the batch is submitted: it can be accepted or settled. */
  ready: boolean;
};

export type ReviewAssignment = {
  id: string;
  annotator: { userId: string; name: string };
  state: AssignmentState;
  spans: AnnotatedSpan[];
  submittedAt: string | null;
  reviewComment: string | null;
};

export type ReviewDocumentView = {
  batch: { id: string; name: string; dueDate: string | null };
  corpusId: string;
  document: AnnotationDocument;
  entityTypes: EntityType[];
  assignments: ReviewAssignment[];
  gold: Span[] | null;
  ready: boolean;
};

export type PairAgreement = {
  annotatorA: { userId: string; name: string };
  annotatorB: { userId: string; name: string };
  /** Documents both annotators finished. */
  documents: number;
  tokens: number;
  /** Entity-level F1 with exact span and type, pooled over the documents. */
  f1: number;
  matched: number;
  onlyA: number;
  onlyB: number;
  /** Cohen's kappa on the IOB2 token labels of the documents, pooled. */
  kappa: number;
};

export type BatchAgreement = {
  batchId: string;
  pairs: PairAgreement[];
  /** All pairs pooled; null when no document has two finished assignments. */
  overall: { documents: number; f1: number; kappa: number } | null;
};
