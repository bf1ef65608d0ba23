import type { Db } from "@/db/types";
import { db as defaultDb } from "@/db/knex";
import { enqueueJob } from "@/jobs/boss";
import { logger } from "@/logger";
import { insertOutboundEmail } from "./mail.repository";
import type { EmailContent } from "./templates";

export const SEND_EMAIL_QUEUE = "send-email";

/**
 * Stores a message for sending (inside the caller's transaction when given). The message is kept
 * until an SMTP server accepts it; call dispatchEmails with the returned ids after the commit.
 */
export async function queueEmail(
  db: Db | undefined,
  input: { to: string; organizationId: string | null; kind: string; content: EmailContent },
): Promise<string> {
  return insertOutboundEmail(
    { to: input.to, organizationId: input.organizationId, kind: input.kind, ...input.content },
    db ?? defaultDb,
  );
}

/**
 * Hands stored messages to the send job. A failure here is logged, not thrown: the request that
 * made the message has succeeded, and the worker's sweeper picks up messages whose job was lost.
 */
export async function dispatchEmails(ids: readonly string[]): Promise<void> {
  for (const emailId of ids) {
    try {
      await enqueueJob(SEND_EMAIL_QUEUE, { emailId }, { retryLimit: 8, retryDelay: 5, retryBackoff: true });
    } catch (err) {
      logger.warn({ err, emailId }, "could not enqueue e-mail; the sweeper will retry");
    }
  }
}
