import type { FileProblem } from "@tagloom/contracts";
import { ColumnFormatError, parseColumnText, tagsToChunks } from "@tagloom/tagger";
import { decodeUtf8 } from "./text-file";
import { type ExtractContext, type ExtractedDocument, FileRefusal, type ImportedSpan, MAX_LISTED_PROBLEMS, checkDocumentText, titleFromFilename } from "./refusal";

/** The 1-based line of the first token tagged with the type (B-TYPE or I-TYPE), for messages. */
function firstLineOfType(content: string, type: string): number {
  const lines = content.split(/\r\n|\n|\r/);
  const suffixes = [`B-${type}`, `I-${type}`];
  const index = lines.findIndex((l) => {
    const last = l.trim().split(/[ \t]+/).pop() ?? "";
    return suffixes.includes(last);
  });
  return index + 1;
}

/**
 * A CoNLL-style column file (.conll, .bio): the token in the first column, an IOB1 or IOB2 tag
 * in the last, a blank line between sentences and `-DOCSTART-` starting a document. Each
 * document's text is rebuilt from its tokens, one space between tokens and a line break between
 * sentences; the file's tokens and sentences are kept as the document's tokens (no re-tokenizing),
 * and spans come from the tags by the conlleval chunk rules (tagsToChunks).
 */
export function extractColumnFile(bytes: Uint8Array, ctx: ExtractContext): ExtractedDocument[] {
  const content = decodeUtf8(bytes);
  let parsed: ReturnType<typeof parseColumnText>;
  try {
    parsed = parseColumnText(content, { file: ctx.filename, scheme: "iob" });
  } catch (err) {
    if (err instanceof ColumnFormatError) {
      throw new FileRefusal(`cannot be read as a column file: line ${err.line}: ${err.reason}. Nothing from this file was imported.`, [
        { line: err.line, message: err.reason },
      ]);
    }
    throw err;
  }

  const unknown = new Set<string>();
  const docs: ExtractedDocument[] = [];
  const fileTitle = titleFromFilename(ctx.filename);
  const many = parsed.documents.length > 1;
  const problems: FileProblem[] = [];
  parsed.documents.forEach((doc, d) => {
    const parts: string[] = [];
    const starts: number[] = [];
    const ends: number[] = [];
    const sentenceStarts: number[] = [];
    const spans: ImportedSpan[] = [];
    let offset = 0;
    doc.sentences.forEach((sentence, s) => {
      if (s > 0) {
        parts.push("\n");
        offset += 1;
      }
      const firstToken = starts.length;
      sentenceStarts.push(firstToken);
      sentence.words.forEach((word, w) => {
        if (w > 0) {
          parts.push(" ");
          offset += 1;
        }
        starts.push(offset);
        parts.push(word);
        offset += word.length;
        ends.push(offset);
      });
      for (const chunk of tagsToChunks(sentence.tags)) {
        if (!ctx.knownTypes.has(chunk.type)) unknown.add(chunk.type);
        spans.push({ start: starts[firstToken + chunk.start]!, end: ends[firstToken + chunk.end - 1]!, type: chunk.type });
      }
    });
    const text = parts.join("");
    const textProblem = checkDocumentText(text, ctx.maxDocumentChars);
    if (textProblem && problems.length < MAX_LISTED_PROBLEMS) problems.push({ line: 1, message: `document ${d + 1} ${textProblem}` });
    docs.push({
      sourceIndex: d,
      title: many ? `${fileTitle} ${d + 1}`.slice(0, 300) : fileTitle,
      text,
      spans,
      tokens: { starts, ends, sentenceStarts },
    });
  });

  for (const type of [...unknown].sort()) {
    if (problems.length < MAX_LISTED_PROBLEMS) {
      problems.push({ line: firstLineOfType(content, type), message: `type ${type} is not in the corpus's entity schema; add it first` });
    }
  }
  if (problems.length) {
    problems.sort((a, b) => a.line - b.line);
    throw new FileRefusal(`has ${problems.length} problem${problems.length === 1 ? "" : "s"}, first on line ${problems[0]!.line}: ${problems[0]!.message}. Nothing from this file was imported.`, problems);
  }
  return docs;
}
