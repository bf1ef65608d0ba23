import nodemailer from "nodemailer";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { type MailCatcher, startMailCatcher } from "./mail-catcher";

let catcher: MailCatcher;
beforeAll(async () => {
  catcher = await startMailCatcher();
});
afterAll(async () => {
  await catcher.stop();
});

describe("mail catcher", () => {
  it("keeps a message sent over SMTP and lists it over HTTP", async () => {
    const transport = nodemailer.createTransport({ host: "127.0.0.1", port: catcher.smtpPort, secure: false, ignoreTLS: true });
    await transport.sendMail({ from: "a@example.test", to: "b@example.test", subject: "Hello", text: "Body text", html: "<p>Body</p>" });
    const msg = await catcher.waitFor((m) => m.subject === "Hello");
    expect(msg.to).toEqual(["b@example.test"]);
    expect(msg.text.trim()).toBe("Body text");
    const list = (await (await fetch(`${catcher.httpUrl}/messages`)).json()) as { items: { id: string }[] };
    expect(list.items.map((m) => m.id)).toContain(msg.id);
    const one = await fetch(`${catcher.httpUrl}/messages/${msg.id}`);
    expect(one.status).toBe(200);
    expect((await fetch(`${catcher.httpUrl}/messages/nope`)).status).toBe(404);
  });
});
