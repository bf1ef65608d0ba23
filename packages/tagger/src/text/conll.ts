import { isIobTag } from "./bio";

/** One sentence of a column file: a word and a tag per token (same lengths). */
export type TaggedSentence = { words: string[]; tags: string[] };

/** The sentences between two `-DOCSTART-` lines (or the whole file when it has none). */
export type ColumnDocument = { sentences: TaggedSentence[] };

/** `iob`: every tag is O, B-TYPE or I-TYPE (IOB1 or IOB2); `plain`: any other tag set, e.g. POS. */
export type TagScheme = "iob" | "plain";

/** A column file that cannot be read, with the 1-based line where reading stopped. */
export class ColumnFormatError extends Error {
  override readonly name = "ColumnFormatError";
  readonly file: string;
  readonly line: number;
  readonly reason: string;

  constructor(file: string, line: number, reason: string) {
    super(`${file}:${line}: ${reason}`);
    this.file = file;
    this.line = line;
    this.reason = reason;
  }
}

const DOCUMENT_START = "-DOCSTART-";
const EDGE_BLANKS = /^[ \t]+|[ \t]+$/g;
const COLUMN_GAP = /[ \t]+/;

/**
 * Reads a CoNLL-style column file: one token per line, the word in the first column and the tag
 * in the last, columns separated by tabs or spaces (middle columns are ignored); a blank line ends
 * a sentence; a line whose first column is `-DOCSTART-` starts a new document and is not a token.
 * A UTF-8 byte-order mark is dropped; LF, CRLF and CR line ends are all accepted.
 *
 * Options: `file` names the input in errors (default `<input>`); `scheme` `auto` (default) gives
 * `iob` when every tag is O, B-TYPE or I-TYPE and `plain` otherwise, while `iob` makes any other
 * tag an error; `requireTags` (default true) makes a one-column line an error, and when false such
 * a line is a token with tag "".
 *
 * IOB tags come back as written (IOB1 allowed); convert with toIob2. Sentences and documents with
 * no tokens are dropped. Throws ColumnFormatError; a file with no token at all is reported at
 * line 1.
 */
export function parseColumnText(
  text: string,
  options: { file?: string; scheme?: "auto" | "iob" | "plain"; requireTags?: boolean } = {},
): { documents: ColumnDocument[]; scheme: TagScheme } {
  const file = options.file ?? "<input>";
  const scheme = options.scheme ?? "auto";
  const requireTags = options.requireTags ?? true;
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const lines = body.split(/\r\n|\n|\r/);

  const documents: ColumnDocument[] = [];
  let sentences: TaggedSentence[] = [];
  let words: string[] = [];
  let tags: string[] = [];
  let everyTagIob = true;

  const endSentence = (): void => {
    if (words.length > 0) sentences.push({ words, tags });
    words = [];
    tags = [];
  };
  const endDocument = (): void => {
    endSentence();
    if (sentences.length > 0) documents.push({ sentences });
    sentences = [];
  };

  for (let n = 0; n < lines.length; n++) {
    const trimmed = lines[n].replace(EDGE_BLANKS, "");
    if (trimmed.length === 0) {
      endSentence();
      continue;
    }
    const columns = trimmed.split(COLUMN_GAP);
    if (columns[0] === DOCUMENT_START) {
      endDocument();
      continue;
    }
    let tag = "";
    if (columns.length >= 2) tag = columns[columns.length - 1];
    else if (requireTags) throw new ColumnFormatError(file, n + 1, "expected at least 2 columns (token and tag)");
    if (!isIobTag(tag)) {
      if (scheme === "iob") {
        const reason = tag === "" ? "missing tag" : `tag ${JSON.stringify(tag)} is not an IOB tag`;
        throw new ColumnFormatError(file, n + 1, `${reason} (scheme iob expects O, B-TYPE or I-TYPE)`);
      }
      everyTagIob = false;
    }
    words.push(columns[0]);
    tags.push(tag);
  }
  endDocument();

  if (documents.length === 0) throw new ColumnFormatError(file, 1, "no tokens");
  const detected: TagScheme = scheme === "plain" ? "plain" : scheme === "iob" || everyTagIob ? "iob" : "plain";
  return { documents, scheme: detected };
}

const UNWRITABLE = /[ \t\r\n]/;

/**
 * Writes sentences as a column file: `word<TAB>tag` per token and a blank line after each
 * sentence; empty sentences are skipped. Throws RangeError when a sentence's words and tags differ
 * in length, or when a word or tag is empty, holds a space, tab or line break, or a word is
 * `-DOCSTART-` — parseColumnText could not read those back.
 */
export function formatTaggedSentences(sentences: readonly TaggedSentence[]): string {
  const parts: string[] = [];
  sentences.forEach(({ words, tags }, s) => {
    if (words.length !== tags.length) {
      throw new RangeError(`sentence ${s} has ${words.length} words but ${tags.length} tags`);
    }
    if (words.length === 0) return;
    for (let i = 0; i < words.length; i++) {
      const word = words[i];
      const tag = tags[i];
      if (word.length === 0 || UNWRITABLE.test(word) || word === DOCUMENT_START) {
        throw new RangeError(`sentence ${s} token ${i}: word ${JSON.stringify(word)} cannot be written to a column file`);
      }
      if (tag.length === 0 || UNWRITABLE.test(tag)) {
        throw new RangeError(`sentence ${s} token ${i}: tag ${JSON.stringify(tag)} cannot be written to a column file`);
      }
      parts.push(word, "\t", tag, "\n");
    }
    parts.push("\n");
  });
  return parts.join("");
}
