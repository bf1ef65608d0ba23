import type { CaughtMessage, MailCatcher } from "@tagloom/fakes";

/** The mail catcher of this test file (started by per-file-setup.ts). */
export function testMail(): MailCatcher {
  const c = (globalThis as { __tagloomMail?: MailCatcher }).__tagloomMail;
  if (!c) throw new Error("mail catcher not started");
  return c;
}

/** Waits for the next message to an address whose subject matches, and returns its first link. */
export async function waitForMail(to: string, subject: RegExp, timeoutMs = 15_000): Promise<CaughtMessage & { link: string }> {
  const msg = await testMail().waitFor((m) => m.to.includes(to) && subject.test(m.subject), timeoutMs);
  const link = /https?:\/\/\S+/.exec(msg.text)?.[0] ?? "";
  return { ...msg, link };
}
