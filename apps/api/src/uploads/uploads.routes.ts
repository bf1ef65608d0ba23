import { fileListQuerySchema, pageQuerySchema, uploadOptionsSchema } from "@tagloom/contracts";
import { type RequestHandler, Router } from "express";
import multer from "multer";
import { getCorpus, getWritableCorpus } from "@/corpora/corpora.service";
import { AppError, PayloadTooLargeError, ValidationError } from "@/errors";
import { actorOf, allow, anyMember, memberOf, viewCorpusData } from "@/orgs/org-access";
import { getUploadLimits } from "./upload-limits";
import { type ReceivedFile, boundedMemoryStorage, formatBytes } from "./upload-storage";
import { getFilesPage, getUploadResult, getUploadsPage, receiveUpload } from "./uploads.service";
import { bodyOrEmpty, idParams, noQuery, validate, validated } from "@/security/route-meta";

export const uploadsRouter = Router({ mergeParams: true });

/**
 * Reads the multipart body: the `files` parts (any number up to the limit) and the option fields.
 * The whole request is refused before reading when its declared size is over the limit; multer's
 * own errors become our 400 and 413 answers.
 */
const receiveFiles: RequestHandler = (req, res, next) => {
  const limits = getUploadLimits();
  const declared = Number(req.headers["content-length"] ?? 0);
  // Multipart framing adds a little per file; allow 1 KB per file on top of the byte limit.
  if (declared > limits.maxUploadBytes + limits.maxFilesPerUpload * 1024) {
    next(new PayloadTooLargeError(`The upload is ${formatBytes(declared)}; one upload may be at most ${formatBytes(limits.maxUploadBytes)}. Send the files in smaller groups.`, { maxUploadBytes: limits.maxUploadBytes }));
    return;
  }
  const middleware = multer({
    storage: boundedMemoryStorage(limits),
    defParamCharset: "utf8",
    limits: { files: limits.maxFilesPerUpload, fields: 20, fieldSize: 1024, parts: limits.maxFilesPerUpload + 20 },
  }).array("files");
  middleware(req, res, (err?: unknown) => {
    if (err instanceof multer.MulterError) {
      if (err.code === "LIMIT_FILE_COUNT" || err.code === "LIMIT_PART_COUNT") {
        next(new PayloadTooLargeError(`One upload may hold at most ${limits.maxFilesPerUpload} files. Send the files in smaller groups.`, { maxFilesPerUpload: limits.maxFilesPerUpload }));
      } else if (err.code === "LIMIT_UNEXPECTED_FILE") {
        next(new ValidationError(`Send files in the "files" field (got "${err.field ?? ""}").`, { fields: { files: ["Unexpected field."] } }));
      } else {
        next(new ValidationError(`The upload form is not valid (${err.message}).`));
      }
      return;
    }
    if (err === undefined || err instanceof AppError) {
      next(err);
      return;
    }
    // busboy's parse errors (a truncated body, no boundary, a broken part header) are the
    // client's malformed request, never ours: a 400 that names what busboy found.
    const detail = err instanceof Error ? err.message : String(err);
    next(new ValidationError(`The upload form is malformed (${detail}). Send it again as multipart/form-data.`, { fields: { files: ["Malformed multipart body."] } }));
  });
};

uploadsRouter.get("/corpora/:corpusId/uploads/limits", anyMember, validate({ params: idParams("corpusId"), query: noQuery }), async (req, res) => {
  await getCorpus(memberOf(req).organizationId, String(req.params.corpusId));
  res.json(getUploadLimits());
});

// The corpus is checked before the body is read, so a wrong or archived corpus costs no upload.
const corpusIsWritable: RequestHandler = async (req, _res, next) => {
  await getWritableCorpus(memberOf(req).organizationId, String(req.params.corpusId));
  next();
};

uploadsRouter.post("/corpora/:corpusId/uploads", allow("manager"), corpusIsWritable, receiveFiles, validate({ params: idParams("corpusId"), query: noQuery, body: bodyOrEmpty(uploadOptionsSchema) }), async (req, res) => {
  const files = ((req.files as unknown as ReceivedFile[] | undefined) ?? []).map((f) => ({ ...f }));
  const result = await receiveUpload(memberOf(req).organizationId, String(req.params.corpusId), req.body ?? {}, files, actorOf(req));
  res.status(202).json(result);
});

uploadsRouter.get("/corpora/:corpusId/uploads", viewCorpusData, validate({ params: idParams("corpusId"), query: pageQuerySchema }), async (req, res) => {
  const page = validated(req, "query", pageQuerySchema);
  res.json(await getUploadsPage(memberOf(req).organizationId, String(req.params.corpusId), page));
});

uploadsRouter.get("/corpora/:corpusId/uploads/:uploadId", viewCorpusData, validate({ params: idParams("corpusId", "uploadId"), query: noQuery }), async (req, res) => {
  res.json(await getUploadResult(memberOf(req).organizationId, String(req.params.corpusId), String(req.params.uploadId)));
});

uploadsRouter.get("/corpora/:corpusId/files", viewCorpusData, validate({ params: idParams("corpusId"), query: fileListQuerySchema }), async (req, res) => {
  const query = validated(req, "query", fileListQuerySchema);
  res.json(await getFilesPage(memberOf(req).organizationId, String(req.params.corpusId), query));
});
