import type { AppMeta, OutboxMessage } from "@tagloom/contracts";
import { Router } from "express";
import { env } from "@/config/env";
import { AppError, NotFoundError } from "@/errors";
import { idParams, noQuery, validate } from "@/security/route-meta";

const outboxEnabled = env.NODE_ENV !== "production" && env.MAIL_CATCHER_URL !== undefined;

export const devRouter = Router();

devRouter.get("/meta", validate({ query: noQuery }), (_req, res) => {
  const meta: AppMeta = { environment: env.NODE_ENV, outbox: outboxEnabled };
  res.json(meta);
});

async function fromCatcher<T>(path: string): Promise<T> {
  if (!outboxEnabled) throw new NotFoundError("page");
  let res: Response;
  try {
    res = await fetch(`${env.MAIL_CATCHER_URL}${path}`);
  } catch {
    throw new AppError(502, "mail_catcher_down", "The local mail catcher does not answer.");
  }
  if (res.status === 404) throw new NotFoundError("message");
  if (!res.ok) throw new AppError(502, "mail_catcher_error", `The local mail catcher answered ${res.status}.`);
  return (await res.json()) as T;
}

// Development only: the messages the local SMTP catcher received. Refused in production.
devRouter.get("/dev/outbox", validate({ query: noQuery }), async (_req, res) => {
  res.json(await fromCatcher<{ items: OutboxMessage[] }>("/messages"));
});
devRouter.get("/dev/outbox/:id", validate({ params: idParams("id"), query: noQuery }), async (req, res) => {
  res.json(await fromCatcher<OutboxMessage>(`/messages/${encodeURIComponent(String(req.params.id))}`));
});
