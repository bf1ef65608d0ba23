import { openBoundedZip } from "./bounded-zip";
import { normalizeLineEnds } from "./text-file";
import { type ExtractContext, type ExtractedDocument, FileRefusal, checkDocumentText, titleFromFilename } from "./refusal";

/** A .docx file: one document, the raw text of its paragraphs (mammoth), trailing blank lines trimmed. */
export async function extractDocxFile(bytes: Uint8Array, ctx: ExtractContext): Promise<ExtractedDocument[]> {
  const { default: mammoth } = await import("mammoth");
  const file = await openBoundedZip(bytes, { maxEntries: ctx.maxDocxEntries, maxUnpackedBytes: ctx.maxDocxUnpackedBytes });
  let raw: string;
  try {
    // mammoth reads an already opened archive through `file` (mammoth/lib/unzip.js); its typings
    // list only path and buffer.
    raw = (await mammoth.extractRawText({ file } as unknown as { buffer: Buffer })).value;
  } catch (err) {
    if (err instanceof FileRefusal) throw err;
    const message = (err as Error)?.message ?? "";
    if (/zip|central directory/i.test(message)) throw new FileRefusal("is damaged or not a DOCX file (it is not a readable ZIP archive)");
    if (/main document part/i.test(message)) throw new FileRefusal("is not a DOCX file (it has no Word document inside)");
    throw new FileRefusal(`could not be read as a DOCX file (${message || "unknown error"})`);
  }
  const text = normalizeLineEnds(raw).replace(/\s+$/, "");
  const problem = checkDocumentText(text, ctx.maxDocumentChars);
  if (problem) throw new FileRefusal(problem);
  return [{ sourceIndex: 0, title: titleFromFilename(ctx.filename), text }];
}
