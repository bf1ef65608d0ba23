import type { DocumentSplit, DocumentTokens, FileProblem } from "@tagloom/contracts";

/** A span read from a file: character offsets, a type name and, for suggestions, a confidence. */
export type ImportedSpan = { start: number; end: number; type: string; confidence?: number | undefined };

/** One document read from a file, before it is tokenized and stored. */
export type ExtractedDocument = {
  /** Line (JSONL) or document (column file) number inside the file, from 0; 0 for single-document files. */
  sourceIndex: number;
  title: string;
  text: string;
  /** The split the file gave (JSONL), or undefined to use the upload's default. */
  split?: DocumentSplit | null | undefined;
  /** Spans the file gave; undefined when the file carries no annotation for the document. */
  spans?: ImportedSpan[] | undefined;
  /** Tokens the file gave (column files); undefined to tokenize the text. */
  tokens?: DocumentTokens | undefined;
};

/** A file that cannot be imported: the reason a person reads, and per-line problems if any. */
export class FileRefusal extends Error {
  override readonly name = "FileRefusal";
  constructor(
    readonly reason: string,
    readonly problems: FileProblem[] = [],
  ) {
    super(reason);
  }
}

/** What every extractor needs besides the bytes. */
export type ExtractContext = {
  filename: string;
  /** Entity type names of the corpus (spans of other types are refused). */
  knownTypes: ReadonlySet<string>;
  maxDocumentChars: number;
  /** DOCX archives: at most this many parts, and this many bytes unpacked over the parts read. */
  maxDocxEntries: number;
  maxDocxUnpackedBytes: number;
  /** PDF files: at most this many pages, read within this many milliseconds. */
  maxPdfPages: number;
  extractTimeLimitMs: number;
};

/** At most this many problems are listed per file; the reason says how many there were. */
export const MAX_LISTED_PROBLEMS = 50;

// Bidirectional embedding, override and isolate controls (Unicode Standard Annex #9, "Unicode
// Bidirectional Algorithm", §2.1-2.4: U+202A-U+202E and U+2066-U+2069). In a title they can make
// text display reversed and reorder what is shown beside it (e.g. "report\u202Etxt.exe").
const BIDI_CONTROLS = /[\u202A-\u202E\u2066-\u2069]/g;

/** A title without bidirectional controls; the file's own record keeps its name as sent. */
export function withoutBidiControls(text: string): string {
  return text.replace(BIDI_CONTROLS, "");
}

/** The title a file gives its document: its name without the ending and bidi controls, at most 300 characters. */
export function titleFromFilename(filename: string): string {
  const name = withoutBidiControls(filename);
  const base = name.replace(/\.[^.]+$/, "").trim() || name;
  return base.slice(0, 300);
}

// With the u flag a surrogate pair is one code point, so only unpaired halves match.
const LONE_SURROGATE = /[\uD800-\uDFFF]/u;

/** Refuses text a document cannot hold: empty, too long, with NUL or unpaired surrogates. */
export function checkDocumentText(text: string, maxChars: number): string | null {
  if (text.trim().length === 0) return "has no text";
  if (text.length > maxChars) return `is ${text.length.toLocaleString("en")} characters long; a document may have at most ${maxChars.toLocaleString("en")}`;
  if (text.includes("\u0000")) return "contains NUL characters, which text cannot hold (is it a binary file?)";
  if (LONE_SURROGATE.test(text)) return "contains an unpaired UTF-16 surrogate (a broken character)";
  return null;
}
