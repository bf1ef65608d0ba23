import { z } from "zod";
import { env } from "@/config/env";
import { db } from "@/db/knex";
import { defineJob } from "@/jobs/registry";
import { lockQueuedEmail, listStaleQueuedEmailIds, markEmailAttemptFailed, markEmailSent } from "./mail.repository";
import { SEND_EMAIL_QUEUE, dispatchEmails } from "./mail.service";
import { getMailTransport } from "./mail.transport";

const sendEmailPayload = z.object({ emailId: z.uuid() });

/** Sends one stored message. Idempotent: a sent or locked message is left alone. */
export const sendEmailJob = defineJob({
  queue: SEND_EMAIL_QUEUE,
  concurrency: 2,
  handle: async (data) => {
    const { emailId } = sendEmailPayload.parse(data);
    let failure: Error | null = null;
    await db.transaction(async (trx) => {
      const email = await lockQueuedEmail(emailId, trx);
      if (!email) return;
      try {
        await getMailTransport().sendMail({ from: env.MAIL_FROM, to: email.to, subject: email.subject, text: email.text, html: email.html });
        await markEmailSent(email.id, trx);
      } catch (err) {
        failure = err instanceof Error ? err : new Error(String(err));
      }
    });
    if (failure) {
      await markEmailAttemptFailed(emailId, (failure as Error).message);
      throw failure;
    }
  },
});

/** Every few minutes: re-dispatch messages still queued long after they were made. */
export const sweepEmailJob = defineJob({
  queue: "sweep-email",
  schedule: "*/5 * * * *",
  handle: async () => {
    await dispatchEmails(await listStaleQueuedEmailIds(120));
  },
});
