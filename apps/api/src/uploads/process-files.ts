import type { EntityType } from "@tagloom/contracts";
import { env } from "@/config/env";
import { listEntityTypes } from "@/corpora/corpora.service";
import { db as defaultDb } from "@/db/knex";
import { type DocumentToImport, importDocuments, tokenizeDocumentText } from "@/documents/documents.service";
import { NotFoundError } from "@/errors";
import { logger } from "@/logger";
import { suggestForUploadedFiles } from "@/suggestions/suggestions.service";
import { extractFile } from "./extract/extract-file";
import { FileRefusal } from "./extract/refusal";
import { getUploadLimits } from "./upload-limits";
import type { ExtractJobData } from "./uploads.service";
import { type ClaimedFile, type FileOutcome, type UploadRow, claimFiles, findFileContent, findUpload, finishFiles, lockUnfinishedFiles } from "./uploads.repository";

type FileWork = { file: ClaimedFile; outcome: FileOutcome; docs: DocumentToImport[] };

/** PostgreSQL errors that come from one document's data (class 22 data exception, 54 program limit). */
function isDataError(err: unknown): boolean {
  const code = (err as { code?: unknown })?.code;
  return typeof code === "string" && (code.startsWith("22") || code.startsWith("54"));
}

async function readFile(file: ClaimedFile, organizationId: string, upload: UploadRow, types: EntityType[]): Promise<FileWork> {
  const refused = (error: string, problems: FileOutcome["problems"] = []): FileWork => ({
    file,
    outcome: { id: file.id, state: "failed", error, problems, documentsCreated: 0 },
    docs: [],
  });
  const content = await findFileContent(organizationId, file.id);
  if (!content) return refused("has no stored content (it was already processed or removed)");
  try {
    const extracted = await extractFile(file.format, content, {
      filename: file.filename,
      knownTypes: new Set(types.map((t) => t.name)),
      maxDocumentChars: getUploadLimits().maxDocumentChars,
      maxDocxEntries: env.UPLOAD_MAX_DOCX_ENTRIES,
      maxDocxUnpackedBytes: env.UPLOAD_MAX_DOCX_UNPACKED_BYTES,
      maxPdfPages: env.UPLOAD_MAX_PDF_PAGES,
      extractTimeLimitMs: env.UPLOAD_EXTRACT_SECONDS * 1000,
    });
    const docs = extracted.map((d) => ({
      uploadFileId: file.id,
      sourceIndex: d.sourceIndex,
      title: d.title,
      text: d.text,
      split: d.split === undefined ? upload.defaultSplit : d.split,
      tokens: d.tokens ?? tokenizeDocumentText(d.text),
      spans: d.spans,
    }));
    return { file, outcome: { id: file.id, state: "ready", error: null, problems: [], documentsCreated: docs.length }, docs };
  } catch (err) {
    if (err instanceof FileRefusal) return refused(err.reason, err.problems);
    logger.error({ err, fileId: file.id, filename: file.filename }, "file extraction failed unexpectedly");
    return refused("could not be read because of an unexpected error; try it again or in another format");
  }
}

/**
 * Writes the files' documents and outcomes in one transaction, after locking the file rows: a file
 * that another run of the job (a retry, or a duplicate running at the same time) finished
 * meanwhile is left as that run wrote it. Without the lock, a run that claimed a file just before
 * another stored it would find its bytes gone and mark it refused over its stored documents.
 * Returns the ids of the files this run wrote.
 */
async function store(organizationId: string, upload: UploadRow, types: EntityType[], work: FileWork[]): Promise<string[]> {
  return defaultDb.transaction(async (trx) => {
    const open = await lockUnfinishedFiles(organizationId, work.map((w) => w.file.id), trx);
    const mine = work.filter((w) => open.has(w.file.id));
    await importDocuments(
      organizationId,
      upload.corpusId,
      mine.flatMap((w) => w.docs),
      { spanMode: upload.spanMode, userId: upload.createdBy, types },
      trx,
    );
    await finishFiles(organizationId, mine.map((w) => w.outcome), trx);
    return mine.map((w) => w.file.id);
  });
}

/**
 * The extraction job for a group of files: each file is read into documents (text, tokens,
 * spans) or refused with a reason, then all of the group's documents and file states are written
 * in one transaction. If that fails on one document's data (for instance text PostgreSQL cannot
 * index), the files are written one by one so that only the culprit fails. Files already finished
 * are skipped (when claimed, and again under a row lock when stored) and documents are unique per
 * (file, index), so a retried or duplicated job adds nothing twice and never undoes another's work.
 */
export async function processFileGroup(data: ExtractJobData): Promise<void> {
  const { organizationId, corpusId, uploadId, fileIds } = data;
  const upload = await findUpload(organizationId, corpusId, uploadId);
  if (!upload) return; // the corpus was deleted meanwhile
  let types: EntityType[];
  try {
    types = await listEntityTypes(organizationId, corpusId);
  } catch (err) {
    if (err instanceof NotFoundError) return;
    throw err;
  }
  const claimed = await claimFiles(organizationId, fileIds);
  if (!claimed.length) return;

  const work: FileWork[] = [];
  for (const file of claimed) work.push(await readFile(file, organizationId, upload, types));

  const stored: string[] = [];
  try {
    stored.push(...(await store(organizationId, upload, types, work)));
  } catch (err) {
    if (!isDataError(err)) throw err;
    for (const w of work) {
      try {
        stored.push(...(await store(organizationId, upload, types, [w])));
      } catch (fileErr) {
        if (!isDataError(fileErr)) throw fileErr;
        const message = (fileErr as Error).message.split(" - ").pop() ?? "a database limit";
        await store(organizationId, upload, types, [
          { ...w, docs: [], outcome: { ...w.outcome, state: "failed", error: `could not be stored: ${message}`, documentsCreated: 0 } },
        ]);
      }
    }
  }
  // The corpus's suggester (if any) pre-annotates the new documents (once: only the run that stored them).
  await suggestForUploadedFiles(organizationId, corpusId, stored);
}
