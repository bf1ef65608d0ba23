import { normalizeLineEnds } from "./text-file";
import { type ExtractContext, type ExtractedDocument, FileRefusal, checkDocumentText, titleFromFilename } from "./refusal";

/**
 * A .pdf file: one document, its pages' text joined by a blank line. pdf-parse's own text puts
 * "-- N of M --" markers between pages; reading the pages one by one leaves them out without
 * touching a document that happens to contain such a line. Encrypted, corrupt and image-only
 * files are refused with a reason, and so are files over the page, text or time limit.
 */
export async function extractPdfFile(bytes: Uint8Array, ctx: ExtractContext): Promise<ExtractedDocument[]> {
  const { PDFParse } = await import("pdf-parse");
  const parser = new PDFParse({ data: new Uint8Array(bytes) });
  const pages: string[] = [];
  const deadline = Date.now() + ctx.extractTimeLimitMs;
  try {
    const { total } = await parser.getInfo();
    if (total > ctx.maxPdfPages) {
      throw new FileRefusal(`has ${total.toLocaleString("en")} pages; a PDF may have at most ${ctx.maxPdfPages.toLocaleString("en")}`);
    }
    // Page by page, so that a file over the text or time limit stops being read there.
    let chars = 0;
    for (let page = 1; page <= total; page += 1) {
      if (Date.now() >= deadline) {
        throw new FileRefusal(`took longer than ${Math.round(ctx.extractTimeLimitMs / 1000)} s to read (stopped at page ${page} of ${total}); split it into smaller files`);
      }
      const text = ((await parser.getText({ partial: [page] })).pages[0]?.text ?? "").trim();
      chars += text.length;
      if (chars > ctx.maxDocumentChars) {
        throw new FileRefusal(`has more than ${ctx.maxDocumentChars.toLocaleString("en")} characters of text (reading stopped at page ${page} of ${total}); a document may have at most ${ctx.maxDocumentChars.toLocaleString("en")}`);
      }
      pages.push(text);
    }
  } catch (err) {
    if (err instanceof FileRefusal) throw err;
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
