import { z } from "zod";
import { defineJob } from "@/jobs/registry";
import { processFileGroup } from "./process-files";
import { EXTRACT_QUEUE } from "./uploads.service";

const payloadSchema = z.object({
  organizationId: z.uuid(),
  corpusId: z.uuid(),
  uploadId: z.uuid(),
  fileIds: z.array(z.uuid()).min(1).max(1000),
});

/** Extraction and tokenization of uploaded files, one group of files per job. */
export const extractUploadJob = defineJob({
  queue: EXTRACT_QUEUE,
  // Reading PDFs waits on pdf.js while text files mostly wait on the database: two jobs at once
  // keep one process busy.
  concurrency: 2,
  handle: async (data) => processFileGroup(payloadSchema.parse(data)),
});
