import { type ExtractContext, type ExtractedDocument, FileRefusal, checkDocumentText, titleFromFilename } from "./refusal";

const strictUtf8 = new TextDecoder("utf-8", { fatal: true });

/**
 * The byte offset of the first byte that breaks UTF-8 (RFC 3629, section 4 "Syntax of UTF-8 Byte
 * Sequences": no overlong forms, no surrogates, nothing above U+10FFFF), or -1 when all is valid.
 */
export function findInvalidUtf8(bytes: Uint8Array): number {
  let i = 0;
  while (i < bytes.length) {
    const b = bytes[i]!;
    if (b < 0x80) {
      i++;
      continue;
    }
    let need: number;
    let min: number;
    let max = 0xbf;
    if (b >= 0xc2 && b <= 0xdf) [need, min] = [1, 0x80];
    else if (b === 0xe0) [need, min] = [2, 0xa0];
    else if (b === 0xed) [need, min, max] = [2, 0x80, 0x9f];
    else if (b >= 0xe1 && b <= 0xef) [need, min] = [2, 0x80];
    else if (b === 0xf0) [need, min] = [3, 0x90];
    else if (b === 0xf4) [need, min, max] = [3, 0x80, 0x8f];
    else if (b >= 0xf1 && b <= 0xf3) [need, min] = [3, 0x80];
    else return i;
    for (let k = 1; k <= need; k++) {
      const c = bytes[i + k];
      const lo = k === 1 ? min : 0x80;
      const hi = k === 1 ? max : 0xbf;
      if (c === undefined || c < lo || c > hi) return i;
    }
    i += need + 1;
  }
  return -1;
}

/** Decodes strict UTF-8 (a leading byte-order mark dropped); a bad byte refuses the file and says where. */
export function decodeUtf8(bytes: Uint8Array): string {
  try {
    return strictUtf8.decode(bytes);
  } catch {
    const at = findInvalidUtf8(bytes);
    const byte = bytes[at];
    const hex = byte === undefined ? "" : ` (byte 0x${byte.toString(16).toUpperCase().padStart(2, "0")})`;
    throw new FileRefusal(`is not valid UTF-8: the bytes at offset ${at}${hex} do not form a character. Save the file as UTF-8 and upload it again.`);
  }
}

/** Line ends as \n, so offsets do not depend on the system the file was written on. */
export function normalizeLineEnds(text: string): string {
  return text.replace(/\r\n?/g, "\n");
}

/** A .txt file: one document, its whole text. */
export function extractTextFile(bytes: Uint8Array, ctx: ExtractContext): ExtractedDocument[] {
  const text = normalizeLineEnds(decodeUtf8(bytes));
  const problem = checkDocumentText(text, ctx.maxDocumentChars);
  if (problem) throw new FileRefusal(problem);
  return [{ sourceIndex: 0, title: titleFromFilename(ctx.filename), text }];
}
