import type { UploadFormat } from "@tagloom/contracts";

/** How much work one extraction job takes on: files, bytes, and "weight" (PDF/DOCX count heavier). */
export const GROUP_LIMITS = { files: 500, bytes: 8 * 1024 * 1024, weight: 500 };
const WEIGHT: Record<UploadFormat, number> = { txt: 1, jsonl: 1, conll: 1, pdf: 50, docx: 25 };

/**
 * Splits accepted files into groups, one extraction job each, in upload order. Many small text
 * files share a job (one transaction, bulk inserts); PDFs and DOCX files, slower to read, are
 * spread over more jobs so several workers can share them.
 */
export function planFileGroups(files: ReadonlyArray<{ id: string; sizeBytes: number; format: UploadFormat }>): string[][] {
  const groups: string[][] = [];
  let current: string[] = [];
  let bytes = 0;
  let weight = 0;
  for (const f of files) {
    const w = WEIGHT[f.format];
    if (current.length > 0 && (current.length + 1 > GROUP_LIMITS.files || bytes + f.sizeBytes > GROUP_LIMITS.bytes || weight + w > GROUP_LIMITS.weight)) {
      groups.push(current);
      current = [];
      bytes = 0;
      weight = 0;
    }
    current.push(f.id);
    bytes += f.sizeBytes;
    weight += w;
  }
  if (current.length) groups.push(current);
  return groups;
}
