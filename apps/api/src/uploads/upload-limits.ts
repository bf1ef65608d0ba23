import { type UploadLimits, uploadExtensions } from "@tagloom/contracts";
import { env } from "@/config/env";

/** The upload limits from the environment (UPLOAD_MAX_*), as the route enforces and the web app explains them. */
export function getUploadLimits(): UploadLimits {
  return {
    maxFileBytes: env.UPLOAD_MAX_FILE_BYTES,
    maxFilesPerUpload: env.UPLOAD_MAX_FILES,
    maxUploadBytes: env.UPLOAD_MAX_BYTES,
    maxDocumentChars: env.UPLOAD_MAX_DOCUMENT_CHARS,
    extensions: Object.keys(uploadExtensions),
  };
}
