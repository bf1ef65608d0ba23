import type { UploadFormat } from "@tagloom/contracts";
import { extractColumnFile } from "./column-file";
import { extractDocxFile } from "./docx-file";
import { extractJsonlFile } from "./jsonl-file";
import { extractPdfFile } from "./pdf-file";
import type { ExtractContext, ExtractedDocument } from "./refusal";
import { extractTextFile } from "./text-file";

/** The documents of one uploaded file; throws FileRefusal with a reason when it cannot be imported. */
export async function extractFile(format: UploadFormat, bytes: Uint8Array, ctx: ExtractContext): Promise<ExtractedDocument[]> {
  switch (format) {
    case "txt":
      return extractTextFile(bytes, ctx);
    case "pdf":
      return extractPdfFile(bytes, ctx);
    case "docx":
      return extractDocxFile(bytes, ctx);
    case "jsonl":
      return extractJsonlFile(bytes, ctx);
    case "conll":
      return extractColumnFile(bytes, ctx);
  }
}
