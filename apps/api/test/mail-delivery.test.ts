import { startMailCatcher } from "@tagloom/fakes";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/knex";
import { sendEmailJob } from "@/mail/mail.jobs";
import { type TestServer, startTestServer, uniqueEmail } from "./support/http";
import { testMail } from "./support/mail";

let server: TestServer;
beforeAll(async () => {
  server = await startTestServer();
});

describe("mail delivery", () => {
  it("does not fail the request when the mail server is down, keeps the message, and sends it on a later attempt", async () => {
    const catcher = testMail();
    const port = catcher.smtpPort;
    await catcher.stop();

    // No workers run in this file: the request only stores the message and enqueues its job.
    const email = uniqueEmail("down");
    const res = await server.agent().post("/api/auth/sign-up").send({ email, password: "a long passphrase", name: "Nell", organizationName: "Outage Test Co" });
    expect(res.status).toBe(201);
    const row = await db("outbound_emails").where({ to_address: email }).first();
    expect(row).toMatchObject({ status: "queued", attempts: 0 });

    // A send attempt while the server is down fails (pg-boss retries it) and keeps the message.
    await expect(sendEmailJob.handle({ emailId: row.id }, { id: "attempt-1" })).rejects.toThrow();
    expect(await db("outbound_emails").where({ id: row.id }).first()).toMatchObject({ status: "queued", attempts: 1 });

    // The server is back: the retry sends it once; a duplicate job does nothing.
    const back = await startMailCatcher({ smtpPort: port });
    try {
      await sendEmailJob.handle({ emailId: row.id }, { id: "attempt-2" });
      await sendEmailJob.handle({ emailId: row.id }, { id: "duplicate" });
      const after = await db("outbound_emails").where({ id: row.id }).first();
      expect(after).toMatchObject({ status: "sent", attempts: 2, last_error: null });
      const got = await back.waitFor((m) => m.to.includes(email));
      expect(got.subject).toMatch(/Confirm your e-mail/);
      expect(back.messages().filter((m) => m.to.includes(email))).toHaveLength(1);
    } finally {
      await back.stop();
    }
  });

  it("refuses a malformed job payload", async () => {
    await expect(sendEmailJob.handle({ emailId: "not-a-uuid" }, { id: "x" })).rejects.toThrow();
  });
});
