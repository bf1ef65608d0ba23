import { createHash } from "node:crypto";
import { isUtf8 } from "node:buffer";
import type { FilePage, FileListQuery, Page, Upload, UploadFile, UploadFormat, UploadOptions, UploadResult } from "@tagloom/contracts";
import { unstorableTextReason, uploadExtensions, uploadOptionsSchema } from "@tagloom/contracts";
import { type Actor, recordAudit } from "@/audit/audit.service";
import { env } from "@/config/env";
import { getCorpus, getWritableCorpus } from "@/corpora/corpora.service";
import { decodePageCursor, encodePageCursor } from "@/corpora/page-cursor";
import { db as defaultDb } from "@/db/knex";
import { isUuid } from "@/db/types";
import { enqueueJob } from "@/jobs/boss";
import { NotFoundError, ValidationError } from "@/errors";
import { logger } from "@/logger";
import { findInvalidUtf8 } from "./extract/text-file";
import { planFileGroups } from "./file-groups";
import { getUploadLimits } from "./upload-limits";
import { type ReceivedFile, formatBytes } from "./upload-storage";
import {
  type NewUploadFile,
  type UploadRow,
  countFilesByState,
  failFiles,
  findUpload,
  insertUpload,
  insertUploadFiles,
  listFiles,
  listUploadFiles,
  listUploads,
} from "./uploads.repository";

export const EXTRACT_QUEUE = "uploads.extract";

/** The payload of one extraction job: a group of files of one upload. */
export type ExtractJobData = { organizationId: string; corpusId: string; uploadId: string; fileIds: string[] };

const TEXT_FORMATS: ReadonlySet<UploadFormat> = new Set(["txt", "jsonl", "conll"]);

// NUL and unpaired surrogate halves (the u flag makes a proper pair one code point).
// eslint-disable-next-line no-control-regex -- NUL is exactly what is matched
const UNSTORABLE_CHARS = /\u0000|[\uD800-\uDFFF]/gu;

/** The file name without any folder part a browser may send, at most 255 characters. */
function cleanFilename(name: string): string {
  const base = name.split(/[\\/]/).pop()?.trim() ?? "";
  return (base || "unnamed").slice(0, 255);
}

/**
 * Checks one received file before anything reads it as a document: a known ending, not empty,
 * within the size limit, and bytes that fit the format (UTF-8 for text formats, a PDF header, a
 * ZIP header for DOCX). Returns the format and, when refused, the reason.
 */
export function precheckFile(file: ReceivedFile, maxFileBytes: number): { filename: string; format: UploadFormat | null; refusal: string | null } {
  const nameProblem = unstorableTextReason(file.originalname);
  // A name the database cannot hold is kept with U+FFFD in place of the bad characters, and the
  // file is refused alone: the other files of the upload go ahead.
  const filename = cleanFilename(nameProblem ? file.originalname.replace(UNSTORABLE_CHARS, "\uFFFD") : file.originalname);
  if (nameProblem) return { filename, format: null, refusal: `has a name the service cannot keep (${nameProblem.replace(/^Text/, "it").replace(/\.$/, "")}); rename the file and upload it again` };
  const dot = filename.lastIndexOf(".");
  const ending = dot >= 0 ? filename.slice(dot).toLowerCase() : "";
  const format = uploadExtensions[ending] ?? null;
  if (!format) {
    const known = Object.keys(uploadExtensions).join(", ");
    return { filename, format, refusal: `has ${ending ? `the ending ${ending}` : "no ending"}, which we do not read; use one of ${known}` };
  }
  if (file.oversized || file.size > maxFileBytes) {
    return { filename, format, refusal: `is ${formatBytes(file.size)}; a file may be at most ${formatBytes(maxFileBytes)}` };
  }
  const bytes = file.buffer ?? Buffer.alloc(0);
  if (bytes.length === 0) return { filename, format, refusal: "is empty" };
  if (TEXT_FORMATS.has(format) && !isUtf8(bytes)) {
    const at = findInvalidUtf8(bytes);
    return { filename, format, refusal: `is not valid UTF-8: the bytes at offset ${at} (0x${bytes[at]!.toString(16).toUpperCase().padStart(2, "0")}) do not form a character. Save it as UTF-8 and upload it again.` };
  }
  if (format === "pdf" && !bytes.subarray(0, 1024).includes("%PDF-")) return { filename, format, refusal: "is not a PDF (it does not start with %PDF-)" };
  if (format === "docx" && !(bytes[0] === 0x50 && bytes[1] === 0x4b && bytes[2] === 0x03 && bytes[3] === 0x04)) {
    return { filename, format, refusal: "is not a DOCX file (a DOCX is a ZIP archive, and this is not one)" };
  }
  return { filename, format, refusal: null };
}

/**
 * Receives an upload: each file is checked, stored (its bytes in upload_files) and queued for an
 * extraction job, or refused with its reason. One bad file never stops the others. The answer
 * lists every file with its state; jobs then move accepted files to ready or failed.
 */
export async function receiveUpload(
  organizationId: string,
  corpusId: string,
  rawOptions: UploadOptions | unknown,
  files: ReceivedFile[],
  actor: Actor,
): Promise<UploadResult> {
  const options = uploadOptionsSchema.safeParse(rawOptions ?? {});
  if (!options.success) {
    const fields: Record<string, string[]> = {};
    for (const i of options.error.issues) (fields[i.path.join(".") || "_"] ??= []).push(i.message);
    throw new ValidationError("The upload options are not valid.", { fields });
  }
  if (files.length === 0) throw new ValidationError("Choose at least one file to upload.", { fields: { files: ["No files were sent."] } });
  const limits = getUploadLimits();
  const corpus = await getWritableCorpus(organizationId, corpusId);

  const prepared: NewUploadFile[] = files.map((file, fileIndex) => {
    const { filename, format, refusal } = precheckFile(file, limits.maxFileBytes);
    const content = refusal ? null : file.buffer;
    return {
      fileIndex,
      filename,
      format,
      sizeBytes: file.size,
      contentHash: content ? createHash("sha256").update(content).digest("hex") : "",
      content,
      refusal,
    };
  });

  const { upload, stored } = await defaultDb.transaction(async (trx) => {
    const upload = await insertUpload(
      { organizationId, corpusId, createdBy: actor.userId, spanMode: options.data.spanMode, defaultSplit: options.data.defaultSplit ?? null },
      trx,
    );
    const stored = await insertUploadFiles(organizationId, corpusId, upload.id, prepared, trx);
    const refused = stored.filter((f) => f.state === "failed").length;
    await recordAudit(trx, actor, organizationId, "upload.created", { type: "upload", id: upload.id, label: corpus.name }, {
      corpusId,
      files: stored.length,
      accepted: stored.length - refused,
      refused,
      spanMode: upload.spanMode,
      defaultSplit: upload.defaultSplit,
      bytes: prepared.reduce((n, f) => n + f.sizeBytes, 0),
    });
    return { upload, stored };
  });
  // Drop the request's buffers before queueing: the bytes are in the database now.
  for (const f of prepared) f.content = null;

  const accepted = stored.filter((f) => f.state === "queued") as Array<UploadFile & { format: UploadFormat }>;
  const groups = planFileGroups(accepted.map((f) => ({ id: f.id, sizeBytes: f.sizeBytes, format: f.format })));
  for (const fileIds of groups) {
    const data: ExtractJobData = { organizationId, corpusId, uploadId: upload.id, fileIds };
    try {
      const jobId = await enqueueJob(EXTRACT_QUEUE, data, { expireInSeconds: env.EXTRACT_JOB_EXPIRE_SECONDS });
      if (!jobId) throw new Error("the job queue refused the job");
    } catch (err) {
      logger.error({ err, uploadId: upload.id }, "could not queue extraction");
      await failFiles(organizationId, fileIds, "could not be queued for processing; upload it again");
    }
  }
  const files2 = groups.length ? await listUploadFiles(organizationId, upload.id) : stored;
  return { upload: { ...upload, counts: countStates(files2) }, files: files2 };
}

function countStates(files: UploadFile[]): Upload["counts"] {
  const counts = { queued: 0, processing: 0, ready: 0, failed: 0 };
  for (const f of files) counts[f.state] += 1;
  return counts;
}

const withCounts = (u: UploadRow, counts: Map<string, Upload["counts"]>): Upload => ({
  ...u,
  counts: counts.get(u.id) ?? { queued: 0, processing: 0, ready: 0, failed: 0 },
});

export async function getUploadsPage(organizationId: string, corpusId: string, page: { cursor?: string | undefined; limit: number }): Promise<Page<Upload>> {
  await getCorpus(organizationId, corpusId);
  const rows = await listUploads(organizationId, corpusId, { limit: page.limit + 1, after: decodePageCursor(page.cursor, "timestamp") });
  const more = rows.length > page.limit;
  const items = more ? rows.slice(0, page.limit) : rows;
  const counts = await countFilesByState(organizationId, corpusId, items.map((u) => u.id));
  const last = items[items.length - 1];
  return {
    items: items.map(({ cursorValue: _c, ...u }) => withCounts(u, counts)),
    nextCursor: more && last ? encodePageCursor(last.cursorValue, last.id) : null,
  };
}

export async function getUploadResult(organizationId: string, corpusId: string, uploadId: string): Promise<UploadResult> {
  await getCorpus(organizationId, corpusId);
  if (!isUuid(uploadId)) throw new NotFoundError("upload");
  const upload = await findUpload(organizationId, corpusId, uploadId);
  if (!upload) throw new NotFoundError("upload");
  const files = await listUploadFiles(organizationId, uploadId);
  return { upload: { ...upload, counts: countStates(files) }, files };
}

/** Files of the corpus (newest first) with the corpus's counts per state, for the Files list. */
export async function getFilesPage(organizationId: string, corpusId: string, query: FileListQuery): Promise<FilePage> {
  await getCorpus(organizationId, corpusId);
  const rows = await listFiles(organizationId, corpusId, { state: query.state, uploadId: query.uploadId }, {
    limit: query.limit + 1,
    after: decodePageCursor(query.cursor, "timestamp"),
  });
  const more = rows.length > query.limit;
  const items = more ? rows.slice(0, query.limit) : rows;
  const perUpload = await countFilesByState(organizationId, corpusId, query.uploadId ? [query.uploadId] : null);
  const counts = { queued: 0, processing: 0, ready: 0, failed: 0 };
  for (const c of perUpload.values()) for (const k of Object.keys(counts) as Array<keyof typeof counts>) counts[k] += c[k];
  const last = items[items.length - 1];
  return {
    items: items.map(({ cursorValue: _c, ...f }) => f),
    nextCursor: more && last ? encodePageCursor(last.cursorValue, last.id) : null,
    counts,
  };
}
