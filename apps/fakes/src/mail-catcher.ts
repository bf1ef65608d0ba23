import { randomUUID } from "node:crypto";
import http from "node:http";
import type { AddressInfo } from "node:net";
import { simpleParser } from "mailparser";
import { SMTPServer } from "smtp-server";

export type CaughtMessage = {
  id: string;
  to: string[];
  from: string;
  subject: string;
  text: string;
  html: string;
  receivedAt: string;
};

export type MailCatcher = {
  smtpPort: number;
  httpPort: number;
  httpUrl: string;
  messages(): CaughtMessage[];
  /** Resolves with the first message (already caught or arriving) that matches. */
  waitFor(match: (m: CaughtMessage) => boolean, timeoutMs?: number): Promise<CaughtMessage>;
  clear(): void;
  stop(): Promise<void>;
};

/**
 * A local stand-in for an SMTP provider: accepts every message on 127.0.0.1 without TLS or
 * authentication, keeps them in memory (newest last, at most `keep`), and lists them over HTTP:
 * GET /messages, GET /messages/:id, DELETE /messages.
 */
export async function startMailCatcher(options: { smtpPort?: number; httpPort?: number; keep?: number } = {}): Promise<MailCatcher> {
  const keep = options.keep ?? 1000;
  const store: CaughtMessage[] = [];
  const waiters = new Set<{ match: (m: CaughtMessage) => boolean; resolve: (m: CaughtMessage) => void }>();

  const smtp = new SMTPServer({
    authOptional: true,
    disabledCommands: ["STARTTLS", "AUTH"],
    logger: false,
    size: 10 * 1024 * 1024,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((parsed) => {
          const to = (session.envelope.rcptTo ?? []).map((r) => r.address);
          const msg: CaughtMessage = {
            id: randomUUID(),
            to,
            from: parsed.from?.text ?? session.envelope.mailFrom?.toString() ?? "",
            subject: parsed.subject ?? "",
            text: parsed.text ?? "",
            html: typeof parsed.html === "string" ? parsed.html : "",
            receivedAt: new Date().toISOString(),
          };
          store.push(msg);
          if (store.length > keep) store.splice(0, store.length - keep);
          for (const w of [...waiters]) {
            if (w.match(msg)) {
              waiters.delete(w);
              w.resolve(msg);
            }
          }
          callback();
        })
        .catch((err: Error) => callback(err));
    },
  });
  await new Promise<void>((resolve, reject) => {
    smtp.once("error", reject);
    smtp.listen(options.smtpPort ?? 0, "127.0.0.1", () => resolve());
  });
  const smtpPort = (smtp.server.address() as AddressInfo).port;

  const web = http.createServer((req, res) => {
    const url = new URL(req.url ?? "/", "http://localhost");
    const send = (status: number, body: unknown) => {
      res.writeHead(status, { "Content-Type": "application/json" });
      res.end(JSON.stringify(body));
    };
    if (req.method === "GET" && url.pathname === "/messages") return send(200, { items: [...store].reverse() });
    if (req.method === "DELETE" && url.pathname === "/messages") {
      store.length = 0;
      return send(200, { ok: true });
    }
    const m = /^\/messages\/([\w-]+)$/.exec(url.pathname);
    if (req.method === "GET" && m) {
      const found = store.find((s) => s.id === m[1]);
      return found ? send(200, found) : send(404, { error: "not found" });
    }
    send(404, { error: "not found" });
  });
  await new Promise<void>((resolve, reject) => {
    web.once("error", reject);
    web.listen(options.httpPort ?? 0, "127.0.0.1", () => resolve());
  });
  const httpPort = (web.address() as AddressInfo).port;

  return {
    smtpPort,
    httpPort,
    httpUrl: `http://127.0.0.1:${httpPort}`,
    messages: () => [...store],
    clear: () => {
      store.length = 0;
    },
    waitFor(match, timeoutMs = 15_000) {
      const found = store.find(match);
      if (found) return Promise.resolve(found);
      return new Promise((resolve, reject) => {
        const w = { match, resolve: (msg: CaughtMessage) => (clearTimeout(timer), resolve(msg)) };
        const timer = setTimeout(() => {
          waiters.delete(w);
          reject(new Error(`no matching e-mail within ${timeoutMs} ms (caught ${store.length})`));
        }, timeoutMs);
        waiters.add(w);
      });
    },
    async stop() {
      await new Promise<void>((resolve) => smtp.close(() => resolve()));
      await new Promise<void>((resolve) => web.close(() => resolve()));
    },
  };
}
