import { type FileProblem, findUnstorableText, jsonlLineSchema } from "@tagloom/contracts";
import { findSpanProblems } from "@/documents/span-checks";
import { decodeUtf8 } from "./text-file";
import { type ExtractContext, type ExtractedDocument, FileRefusal, MAX_LISTED_PROBLEMS, checkDocumentText, titleFromFilename, withoutBidiControls } from "./refusal";

/**
 * A .jsonl file: one document per non-blank line, `{"text", "title"?, "split"?, "spans"?}`.
 * Text is kept byte for byte (no line-end changes), since span offsets point into it. Every line
 * is checked (valid JSON, the shape above, spans inside the text with start < end, a known type
 * and no overlap); if any line has a problem the whole file is refused with every problem listed
 * by line, so a corrected file can be uploaded again without duplicates.
 */
export function extractJsonlFile(bytes: Uint8Array, ctx: ExtractContext): ExtractedDocument[] {
  const content = decodeUtf8(bytes);
  const lines = content.split(/\r\n|\n|\r/);
  const docs: ExtractedDocument[] = [];
  const problems: FileProblem[] = [];
  const fileTitle = titleFromFilename(ctx.filename);
  let total = 0;
  const report = (line: number, message: string) => {
    total++;
    if (problems.length < MAX_LISTED_PROBLEMS) problems.push({ line, message });
  };

  lines.forEach((raw, n) => {
    const line = n + 1;
    if (raw.trim().length === 0) return;
    let value: unknown;
    try {
      value = JSON.parse(raw);
    } catch (err) {
      report(line, `not valid JSON (${(err as Error).message})`);
      return;
    }
    // NUL and lone surrogates in any field (a title, a type) would be refused by the database.
    const unstorable = findUnstorableText(value);
    if (unstorable.length) {
      for (const p of unstorable) report(line, `${p.path === "_" ? "" : `${p.path}: `}${p.message}`);
      return;
    }
    const parsed = jsonlLineSchema.safeParse(value);
    if (!parsed.success) {
      for (const issue of parsed.error.issues) {
        const path = issue.path.length ? `${issue.path.map((p) => (typeof p === "number" ? `[${p}]` : `.${String(p)}`)).join("").replace(/^\./, "")}: ` : "";
        report(line, `${path}${issue.message}`);
      }
      return;
    }
    const { text, title, split, spans } = parsed.data;
    const textProblem = checkDocumentText(text, ctx.maxDocumentChars);
    if (textProblem) {
      report(line, `text ${textProblem}`);
      return;
    }
    if (spans) {
      const spanProblems = findSpanProblems(text.length, spans, ctx.knownTypes, (i) => `spans[${i}]`);
      if (spanProblems.length) {
        for (const p of spanProblems) report(line, p);
        return;
      }
    }
    docs.push({
      sourceIndex: n,
      title: (withoutBidiControls(title ?? "").trim() || `${fileTitle} line ${line}`).slice(0, 300),
      text,
      split,
      spans: spans?.map((s) => ({ start: s.start, end: s.end, type: s.type, confidence: s.confidence })),
    });
  });

  if (total > 0) {
    const lineCount = new Set(problems.map((p) => p.line)).size;
    const listed = total > problems.length ? ` (the first ${problems.length} are listed)` : "";
    throw new FileRefusal(
      `has ${total} problem${total === 1 ? "" : "s"} on ${lineCount}${total > problems.length ? "+" : ""} line${lineCount === 1 ? "" : "s"}${listed}, first on line ${problems[0]!.line}: ${problems[0]!.message}. Nothing from this file was imported.`,
      problems,
    );
  }
  if (docs.length === 0) throw new FileRefusal("has no documents (every line is blank)");
  return docs;
}
