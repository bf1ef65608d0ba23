import { z } from "zod";
import { type AnnotationStatus, type DocumentSplit, type Span, type SuggestedSpan, annotationStatuses, documentSplitSchema } from "./spans";

export const documentSorts = ["created", "title", "tokens"] as const;
export type DocumentSort = (typeof documentSorts)[number];

export const documentListQuerySchema = z.object({
  cursor: z.string().max(500).optional(),
  limit: z.coerce.number().int().min(1).max(200).default(50),
  sort: z.enum(documentSorts).default("created"),
  dir: z.enum(["asc", "desc"]).default("desc"),
  /** `none` finds documents in neither split. */
  split: z.enum(["train", "test", "none"]).optional(),
  status: z.enum(annotationStatuses).optional(),
  /** Words to find, in web-search syntax: `word`, `"a phrase"`, `-not`, `a or b`. */
  q: z.string().trim().max(200).optional(),
});
export type DocumentListQuery = z.infer<typeof documentListQuerySchema>;

/** A row of the Documents table. */
export type DocumentListItem = {
  id: string;
  corpusId: string;
  title: string;
  split: DocumentSplit | null;
  annotationStatus: AnnotationStatus;
  charCount: number;
  tokenCount: number;
  sentenceCount: number;
  filename: string | null;
  createdAt: string;
};

/** Token offsets as parallel arrays (UTF-16, end exclusive); sentences by their first token's index. */
export type DocumentTokens = { starts: number[]; ends: number[]; sentenceStarts: number[] };

/** What the document page shows. */
export type DocumentDetail = DocumentListItem & {
  text: string;
  tokens: DocumentTokens;
  gold: Span[];
  suggestions: SuggestedSpan[];
};

/** Set a split on chosen documents (`null` clears it). */
export const setSplitInputSchema = z.union([
  z.object({
    documentIds: z.array(z.uuid("Not a document id.")).min(1, "Choose at least one document.").max(10_000),
    split: documentSplitSchema.nullable(),
  }),
  z.object({
    /** Share of documents put in the test split; the rest go to train. */
    testPercent: z.number().int("Use a whole percentage.").min(0).max(100),
    seed: z.number().int("Use a whole number.").min(0).max(2 ** 31 - 1),
    /** `all` re-splits every document; `unassigned` only those in neither split. */
    scope: z.enum(["all", "unassigned"]).default("all"),
  }),
]);
export type SetSplitInput = z.input<typeof setSplitInputSchema>;
export type SetSplitResult = { train: number; test: number; cleared: number };

export const uploadFormats = ["txt", "pdf", "docx", "jsonl", "conll"] as const;
export type UploadFormat = (typeof uploadFormats)[number];
/** File name endings the upload accepts, with the format each is read as. */
export const uploadExtensions: Record<string, UploadFormat> = {
  ".txt": "txt",
  ".pdf": "pdf",
  ".docx": "docx",
  ".jsonl": "jsonl",
  ".conll": "conll",
  ".bio": "conll",
};

export const fileStates = ["queued", "processing", "ready", "failed"] as const;
export type FileState = (typeof fileStates)[number];

/** Imported spans become gold or suggestions. */
export const spanModes = ["gold", "suggested"] as const;
export type SpanMode = (typeof spanModes)[number];

/** Form fields sent with the files of an upload. */
export const uploadOptionsSchema = z.object({
  spanMode: z.enum(spanModes).default("gold"),
  defaultSplit: z.preprocess((v) => (v === "" ? undefined : v), documentSplitSchema.optional()),
});
export type UploadOptions = z.input<typeof uploadOptionsSchema>;

export type UploadLimits = {
  maxFileBytes: number;
  maxFilesPerUpload: number;
  maxUploadBytes: number;
  maxDocumentChars: number;
  extensions: string[];
};

/** A problem on one line of a JSONL or column file. */
export type FileProblem = { line: number; message: string };

export type UploadFile = {
  id: string;
  uploadId: string;
  fileIndex: number;
  filename: string;
  format: UploadFormat | null;
  sizeBytes: number;
  state: FileState;
  /** Why the file was refused (state `failed`). */
  error: string | null;
  problems: FileProblem[];
  documentsCreated: number;
  createdAt: string;
  finishedAt: string | null;
};

export type Upload = {
  id: string;
  corpusId: string;
  spanMode: SpanMode;
  defaultSplit: DocumentSplit | null;
  createdBy: string | null;
  createdAt: string;
  counts: Record<FileState, number>;
};

export type UploadResult = { upload: Upload; files: UploadFile[] };

export const fileListQuerySchema = z.object({
  cursor: z.string().max(200).optional(),
  limit: z.coerce.number().int().min(1).max(200).default(50),
  state: z.enum(fileStates).optional(),
  uploadId: z.uuid().optional(),
});
export type FileListQuery = z.infer<typeof fileListQuerySchema>;
export type FilePage = { items: UploadFile[]; nextCursor: string | null; counts: Record<FileState, number> };

export const exportFormats = ["jsonl", "conll"] as const;
export type ExportFormat = (typeof exportFormats)[number];
export const exportQuerySchema = z.object({
  format: z.enum(exportFormats),
  split: z.enum(["train", "test", "all"]).default("all"),
});
export type ExportQuery = z.infer<typeof exportQuerySchema>;

/** One line of a JSONL import or export. */
export const jsonlSpanSchema = z
  .object({
    start: z.number().int("start must be a whole number").min(0, "start must be 0 or more"),
    end: z.number().int("end must be a whole number").min(0, "end must be 0 or more"),
    type: z.string().min(1, "type is empty").max(50),
    confidence: z.number().min(0).max(1).optional(),
  });
export const jsonlLineSchema = z
  .object({
    text: z.string().min(1, "text is empty"),
    title: z.string().max(300).optional(),
    split: documentSplitSchema.nullable().optional(),
    spans: z.array(jsonlSpanSchema).optional(),
  });
export type JsonlLine = z.infer<typeof jsonlLineSchema>;
