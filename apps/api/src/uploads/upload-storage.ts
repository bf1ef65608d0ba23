import type { Request } from "express";
import type { StorageEngine } from "multer";
import { PayloadTooLargeError } from "@/errors";

/** A file as the upload route receives it: its bytes, or only its size when it was too large. */
export type ReceivedFile = { originalname: string; size: number; buffer: Buffer | null; oversized: boolean };

/**
 * multer's memory storage, except that a file over `maxFileBytes` is not an error for the whole
 * request: its bytes are read and dropped and the file comes through marked `oversized`, so the
 * upload can refuse that one file and keep the others. The bytes of the whole request are capped
 * too (`maxUploadBytes`), which covers requests sent without a Content-Length.
 */
export function boundedMemoryStorage(limits: { maxFileBytes: number; maxUploadBytes: number }): StorageEngine {
  const totals = new WeakMap<Request, number>();
  return {
    _handleFile(req, file, cb) {
      const chunks: Buffer[] = [];
      let size = 0;
      let failed = false;
      file.stream.on("data", (chunk: Buffer) => {
        if (failed) return;
        size += chunk.length;
        const total = (totals.get(req) ?? 0) + chunk.length;
        totals.set(req, total);
        if (total > limits.maxUploadBytes) {
          failed = true;
          chunks.length = 0;
          file.stream.resume();
          cb(new PayloadTooLargeError(`The upload is larger than ${formatBytes(limits.maxUploadBytes)}. Send the files in smaller groups.`, { maxUploadBytes: limits.maxUploadBytes }));
          return;
        }
        if (size <= limits.maxFileBytes) chunks.push(chunk);
        else chunks.length = 0;
      });
      file.stream.on("error", (err) => {
        if (!failed) cb(err);
        failed = true;
      });
      file.stream.on("end", () => {
        if (failed) return;
        const oversized = size > limits.maxFileBytes;
        cb(null, { size, buffer: oversized ? null : Buffer.concat(chunks, size), oversized } as Partial<Express.Multer.File>);
      });
    },
    _removeFile(_req, file, cb) {
      (file as Partial<ReceivedFile>).buffer = null;
      cb(null);
    },
  };
}

/** Bytes as a person reads them: "512 bytes", "20 MB" (binary megabytes, written MB). */
export function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} bytes`;
  if (bytes < 1024 * 1024) return `${Math.round((bytes / 1024) * 10) / 10} KB`;
  return `${Math.round((bytes / (1024 * 1024)) * 10) / 10} MB`;
}
