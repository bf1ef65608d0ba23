import { normalizeLineEnds } from "./text-file";
import { type ExtractContext, type ExtractedDocument, FileRefusal, checkDocumentText, titleFromFilename } from "./refusal";

/**
 * A .pdf file: one document, its pages' text joined by a blank line. pdf-parse's own text puts
 * "-- N of M --" markers between pages; reading the pages one by one leaves them out without
 * touching a document that happens to contain such a line. Encrypted, corrupt and image-only
 * files are refused with a reason.
 */
export async function extractPdfFile(bytes: Uint8Array, ctx: ExtractContext): Promise<ExtractedDocument[]> {
  const { PDFParse } = await import("pdf-parse");
  const parser = new PDFParse({ data: new Uint8Array(bytes) });
  let pages: string[];
  try {
    const result = await parser.getText();
    pages = result.pages.map((p) => p.text.trim());
  } catch (err) {
    const name = (err as Error)?.name;
    if (name === "PasswordException") throw new FileRefusal("is encrypted with a password; remove the password and upload it again");
    if (name === "InvalidPDFException" || name === "FormatError") throw new FileRefusal("is damaged or not a PDF (its structure cannot be read)");
    throw new FileRefusal(`could not be read as a PDF (${(err as Error)?.message ?? "unknown error"})`);
  } finally {
    await parser.destroy().catch(() => undefined);
  }
  const text = normalizeLineEnds(pages.filter((p) => p.length > 0).join("\n\n"));
  if (text.trim().length === 0) {
    throw new FileRefusal(`has no text layer (${pages.length} page${pages.length === 1 ? "" : "s"} of images, e.g. a scan); run text recognition on it first`);
  }
  const problem = checkDocumentText(text, ctx.maxDocumentChars);
  if (problem) throw new FileRefusal(problem);
  return [{ sourceIndex: 0, title: titleFromFilename(ctx.filename), text }];
}
