import type { UploadLimits } from "@tagloom/contracts";
import { formatBytes } from "@/lib/format";
import type { LocalRefusal } from "./upload-results";

/**
 * Splits chosen files into requests the API accepts (at most `maxFilesPerUpload` files and
 * `maxUploadBytes` bytes each) and sets aside files it would refuse anyway for their size or
 * ending, so they are not sent at all.
 */
export function planUploads(files: File[], limits: UploadLimits): { batches: File[][]; refused: LocalRefusal[] } {
  const refused: LocalRefusal[] = [];
  const batches: File[][] = [];
  let current: File[] = [];
  let bytes = 0;
  for (const file of files) {
    const dot = file.name.lastIndexOf(".");
    const ending = dot >= 0 ? file.name.slice(dot).toLowerCase() : "";
    if (!limits.extensions.includes(ending)) {
      refused.push({ filename: file.name, sizeBytes: file.size, reason: `has ${ending ? `the ending ${ending}` : "no ending"}, which we do not read; use one of ${limits.extensions.join(", ")}` });
      continue;
    }
    if (file.size > limits.maxFileBytes) {
      refused.push({ filename: file.name, sizeBytes: file.size, reason: `is ${formatBytes(file.size)}; a file may be at most ${formatBytes(limits.maxFileBytes)}` });
      continue;
    }
    if (current.length > 0 && (current.length >= limits.maxFilesPerUpload || bytes + file.size > limits.maxUploadBytes)) {
      batches.push(current);
      current = [];
      bytes = 0;
    }
    current.push(file);
    bytes += file.size;
  }
  if (current.length) batches.push(current);
  return { batches, refused };
}
