import { randomBytes } from "node:crypto";
import fs from "node:fs";
import http from "node:http";
import path from "node:path";
import type { AddressInfo } from "node:net";
import { renderCheckoutPage } from "./checkout-page";
import { type FormValue, list, obj, parseFormBody, str, stringMap } from "./form-body";
import { signPayload } from "./signature";

/* eslint-disable @typescript-eslint/no-explicit-any -- the fake's objects are the provider's JSON shapes */
type Json = Record<string, any>;

export type FakeEvent = { id: string; type: string; payload: string };
export type Delivery = { eventId: string; type: string; status: number | null; error: string | null };

export type PaymentsFake = {
  port: number;
  url: string;
  /** Where signed events are POSTed; may be set after the receiving app has started. */
  setWebhookUrl(url: string | null): void;
  /** While true, every charge (checkout, seat increase, renewal, retry) is declined. */
  setFailPayments(fail: boolean): void;
  /** "auto" delivers each event as it happens; "manual" holds them until deliverHeld(). */
  setDeliveryMode(mode: "auto" | "manual"): void;
  /** Delivers the held events in the given order (default: as they happened). */
  deliverHeld(order?: "as_created" | "reverse"): Promise<Delivery[]>;
  /** Sends an already-sent event once more, signed anew (a provider retry). */
  redeliver(eventId: string): Promise<Delivery>;
  /** Resolves when every event queued in auto mode has been delivered. */
  settled(): Promise<void>;
  events(): FakeEvent[];
  deliveries(): Delivery[];
  held(): FakeEvent[];
  /** Ends the current period of a subscription: a renewal invoice, or the end of a cancelled one. */
  endPeriod(subscriptionId: string): void;
  subscription(id: string): Json | undefined;
  /** Pays an open checkout session as the hosted page's button does. */
  payCheckout(sessionId: string): { ok: boolean; redirect: string | null };
  stop(): Promise<void>;
};

export type PaymentsFakeOptions = {
  port?: number;
  /** The secret key the API must send (Authorization: Bearer ...). */
  secretKey?: string;
  webhookSecret?: string;
  webhookUrl?: string | null;
  /** Prices the fake knows: id → unit amount (minor units) and currency, billed monthly. */
  prices?: Record<string, { unitAmount: number; currency: string }>;
  /**
   * A JSON file holding the customers, checkout sessions, subscriptions and invoices, read at start
   * and rewritten (atomically) after every change, so a restarted fake still knows them. Without
   * it the fake keeps its state in memory only.
   */
  stateFile?: string;
};

type SavedState = { version: 1; invoiceNumber: number; customers: Json[]; sessions: Json[]; subscriptions: Json[]; invoices: Json[] };

function readState(file: string): SavedState | null {
  let text: string;
  try {
    text = fs.readFileSync(file, "utf8");
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === "ENOENT") return null;
    throw err;
  }
  const state = JSON.parse(text) as SavedState;
  if (state.version !== 1) throw new Error(`payments fake: ${file} has an unknown state version ${String(state.version)}`);
  return state;
}

/** Writes beside the target and renames over it, so a crash leaves the old file or the new one, never half of one. */
function writeState(file: string, state: SavedState): void {
  fs.mkdirSync(path.dirname(file), { recursive: true });
  const tmp = `${file}.${process.pid}.tmp`;
  fs.writeFileSync(tmp, JSON.stringify(state));
  fs.renameSync(tmp, file);
}

const PERIOD_SECONDS = 30 * 24 * 60 * 60;
const API_VERSION = "2026-10-28.endive";

class FakeError extends Error {
  constructor(
    readonly status: number,
    readonly type: string,
    message: string,
    readonly code?: string,
    readonly param?: string,
  ) {
    super(message);
  }
}

const missing = (what: string, id: string) => new FakeError(404, "invalid_request_error", `No such ${what}: '${id}'`, "resource_missing", "id");

/**
 * A local stand-in for the payments provider: customers, checkout sessions with a hosted test
 * page, subscriptions with a seat quantity, invoices, and signed webhook events. It answers the
 * requests the official SDK makes for Tagloom with the JSON shapes the SDK reads, keeps its state
 * in memory (and in `stateFile` when given) and listens on 127.0.0.1 only.
 */
export async function startPaymentsFake(options: PaymentsFakeOptions = {}): Promise<PaymentsFake> {
  const secretKey = options.secretKey ?? "sk_test_tagloom_local";
  const webhookSecret = options.webhookSecret ?? "whsec_tagloom_local";
  const prices = options.prices ?? { price_tagloom_seat: { unitAmount: 900, currency: "eur" } };
  let webhookUrl = options.webhookUrl ?? null;
  let failPayments = false;
  let mode: "auto" | "manual" = "auto";
  let baseUrl = "";

  const customers = new Map<string, Json>();
  const sessions = new Map<string, Json & { declined?: boolean }>();
  const subscriptions = new Map<string, Json>();
  const invoices = new Map<string, Json>();
  const events: FakeEvent[] = [];
  const heldEvents: FakeEvent[] = [];
  const deliveryLog: Delivery[] = [];
  let chain: Promise<unknown> = Promise.resolve();
  let invoiceNumber = 0;
  const stateFile = options.stateFile ?? null;
  const saved = stateFile ? readState(stateFile) : null;
  if (saved) {
    for (const c of saved.customers) customers.set(c.id, c);
    for (const x of saved.sessions) sessions.set(x.id, x);
    for (const x of saved.subscriptions) subscriptions.set(x.id, x);
    for (const x of saved.invoices) invoices.set(x.id, x);
    invoiceNumber = saved.invoiceNumber;
  }
  function persist(): void {
    if (!stateFile) return;
    writeState(stateFile, {
      version: 1,
      invoiceNumber,
      customers: [...customers.values()],
      sessions: [...sessions.values()],
      subscriptions: [...subscriptions.values()],
      invoices: [...invoices.values()],
    });
  }

  const now = () => Math.floor(Date.now() / 1000);
  const newId = (prefix: string) => `${prefix}_${randomBytes(12).toString("hex")}`;
  const copy = <T>(o: T): T => JSON.parse(JSON.stringify(o)) as T;

  function priceObject(id: string): Json {
    const p = prices[id];
    if (!p) throw missing("price", id);
    return { id, object: "price", active: true, currency: p.currency, unit_amount: p.unitAmount, recurring: { interval: "month", interval_count: 1 }, type: "recurring" };
  }

  async function send(event: FakeEvent, payload = event.payload): Promise<Delivery> {
    const d: Delivery = { eventId: event.id, type: event.type, status: null, error: null };
    if (!webhookUrl) {
      d.error = "no webhook URL set";
    } else {
      try {
        const res = await fetch(webhookUrl, {
          method: "POST",
          headers: { "Content-Type": "application/json; charset=utf-8", "Stripe-Signature": signPayload(payload, webhookSecret) },
          body: payload,
          signal: AbortSignal.timeout(15_000),
        });
        d.status = res.status;
        await res.arrayBuffer();
      } catch (err) {
        d.error = (err as Error).message;
      }
    }
    deliveryLog.push(d);
    return d;
  }

  function emit(type: string, object: Json): void {
    const event: FakeEvent = { id: newId("evt"), type, payload: "" };
    event.payload = JSON.stringify({
      id: event.id,
      object: "event",
      api_version: API_VERSION,
      created: now(),
      data: { object: copy(object) },
      livemode: false,
      pending_webhooks: 1,
      request: { id: null, idempotency_key: null },
      type,
    });
    events.push(event);
    if (mode === "manual") heldEvents.push(event);
    else chain = chain.then(() => send(event));
  }

  function subscriptionItem(sub: Json): Json {
    return sub.items.data[0];
  }

  function newInvoice(sub: Json, amount: number, periodStart: number, periodEnd: number, reason: string): Json {
    invoiceNumber += 1;
    const item = subscriptionItem(sub);
    const inv: Json = {
      id: newId("in"),
      object: "invoice",
      customer: sub.customer,
      number: `TEST-${String(invoiceNumber).padStart(4, "0")}`,
      status: "open",
      amount_due: amount,
      amount_paid: 0,
      amount_remaining: amount,
      currency: item.price.currency,
      created: now(),
      period_start: periodStart,
      period_end: periodEnd,
      attempt_count: 0,
      attempted: false,
      billing_reason: reason,
      hosted_invoice_url: null,
      livemode: false,
      parent: { type: "subscription_details", subscription_details: { subscription: sub.id, metadata: { ...sub.metadata } }, quote_details: null },
      status_transitions: { paid_at: null, finalized_at: now() },
    };
    invoices.set(inv.id, inv);
    sub.latest_invoice = inv.id;
    return inv;
  }

  /** Tries to charge an open invoice; a decline leaves it open and the subscription past due. */
  function charge(inv: Json): boolean {
    inv.attempt_count += 1;
    inv.attempted = true;
    const subId = inv.parent?.subscription_details?.subscription as string | undefined;
    const sub = subId ? subscriptions.get(subId) : undefined;
    if (failPayments) {
      emit("invoice.payment_failed", inv);
      if (sub && sub.status === "active") {
        sub.status = "past_due";
        emit("customer.subscription.updated", sub);
      }
      return false;
    }
    inv.status = "paid";
    inv.amount_paid = inv.amount_due;
    inv.amount_remaining = 0;
    inv.status_transitions.paid_at = now();
    emit("invoice.paid", inv);
    if (sub && sub.status === "past_due" && ![...invoices.values()].some((i) => i.status === "open" && i.parent?.subscription_details?.subscription === sub.id)) {
      sub.status = "active";
      emit("customer.subscription.updated", sub);
    }
    return true;
  }

  function payCheckout(sessionId: string): { ok: boolean; redirect: string | null } {
    const session = sessions.get(sessionId);
    if (!session) throw missing("checkout.session", sessionId);
    if (session.status !== "open") return { ok: false, redirect: null };
    if (failPayments) {
      session.declined = true;
      return { ok: false, redirect: null };
    }
    const line = session._line as { price: string; quantity: number };
    const price = priceObject(line.price);
    const start = now();
    const sub: Json = {
      id: newId("sub"),
      object: "subscription",
      customer: session.customer,
      status: "active",
      cancel_at_period_end: false,
      cancel_at: null,
      canceled_at: null,
      ended_at: null,
      created: start,
      start_date: start,
      livemode: false,
      metadata: { ...(session._subscriptionMetadata as Record<string, string>) },
      latest_invoice: null,
      items: { object: "list", data: [], has_more: false, total_count: 1, url: "" },
    };
    sub.items.url = `/v1/subscription_items?subscription=${sub.id}`;
    sub.items.data.push({
      id: newId("si"),
      object: "subscription_item",
      subscription: sub.id,
      quantity: line.quantity,
      price,
      created: start,
      current_period_start: start,
      current_period_end: start + PERIOD_SECONDS,
      metadata: {},
    });
    subscriptions.set(sub.id, sub);
    const inv = newInvoice(sub, price.unit_amount * line.quantity, start, start + PERIOD_SECONDS, "subscription_create");
    inv.status = "paid";
    inv.amount_paid = inv.amount_due;
    inv.amount_remaining = 0;
    inv.attempt_count = 1;
    inv.attempted = true;
    inv.status_transitions.paid_at = start;
    session.status = "complete";
    session.payment_status = "paid";
    session.subscription = sub.id;
    session.invoice = inv.id;
    emit("customer.subscription.created", sub);
    emit("invoice.paid", inv);
    emit("checkout.session.completed", session);
    return { ok: true, redirect: String(session.success_url).replace("{CHECKOUT_SESSION_ID}", session.id) };
  }

  function endPeriod(subscriptionId: string): void {
    const sub = subscriptions.get(subscriptionId);
    if (!sub) throw missing("subscription", subscriptionId);
    const item = subscriptionItem(sub);
    if (sub.cancel_at_period_end || sub.status === "past_due") {
      sub.status = "canceled";
      sub.ended_at = item.current_period_end;
      sub.canceled_at = sub.canceled_at ?? now();
      emit("customer.subscription.deleted", sub);
      return;
    }
    item.current_period_start = item.current_period_end;
    item.current_period_end = item.current_period_start + PERIOD_SECONDS;
    const inv = newInvoice(sub, item.price.unit_amount * item.quantity, item.current_period_start, item.current_period_end, "subscription_cycle");
    emit("customer.subscription.updated", sub);
    charge(inv);
  }

  function updateSubscription(sub: Json, body: Record<string, FormValue>): Json {
    if (sub.status === "canceled") throw new FakeError(400, "invalid_request_error", "A canceled subscription can't be updated.", "resource_missing");
    const cancel = str(body.cancel_at_period_end);
    if (cancel !== undefined) {
      sub.cancel_at_period_end = cancel === "true";
      sub.cancel_at = sub.cancel_at_period_end ? subscriptionItem(sub).current_period_end : null;
      sub.canceled_at = sub.cancel_at_period_end ? now() : null;
    }
    if (body.metadata !== undefined) sub.metadata = { ...sub.metadata, ...stringMap(body.metadata) };
    let increase = 0;
    for (const raw of list(body.items)) {
      const it = obj(raw);
      const item = subscriptionItem(sub);
      if (str(it.id) !== item.id) throw new FakeError(400, "invalid_request_error", `No such subscription item: '${str(it.id)}'`, "resource_missing", "items[0][id]");
      const q = Number(str(it.quantity));
      if (!Number.isInteger(q) || q < 1) throw new FakeError(400, "invalid_request_error", "Invalid positive integer", "parameter_invalid_integer", "items[0][quantity]");
      increase = Math.max(0, q - item.quantity);
      item.quantity = q;
    }
    emit("customer.subscription.updated", sub);
    if (increase > 0 && str(body.proration_behavior) === "always_invoice") {
      const item = subscriptionItem(sub);
      // Whole-seat price for the rest of the period: the fake does not prorate by the day.
      const inv = newInvoice(sub, item.price.unit_amount * increase, now(), item.current_period_end, "subscription_update");
      charge(inv);
    }
    return sub;
  }

  function listResponse(url: string, data: Json[]): Json {
    return { object: "list", data, has_more: false, url };
  }

  async function handleApi(method: string, path: string, query: URLSearchParams, body: Record<string, FormValue>): Promise<[number, Json]> {
    let m: RegExpExecArray | null;
    if (method === "POST" && path === "/v1/customers") {
      const c = { id: newId("cus"), object: "customer", created: now(), email: str(body.email) ?? null, name: str(body.name) ?? null, metadata: stringMap(body.metadata), livemode: false };
      customers.set(c.id, c);
      return [200, c];
    }
    if ((m = /^\/v1\/customers\/([\w]+)$/.exec(path)) && method === "GET") {
      const c = customers.get(m[1]!);
      if (!c) throw missing("customer", m[1]!);
      return [200, c];
    }
    if (method === "POST" && path === "/v1/checkout/sessions") {
      const customer = str(body.customer);
      if (!customer || !customers.has(customer)) throw new FakeError(400, "invalid_request_error", `No such customer: '${customer ?? ""}'`, "resource_missing", "customer");
      if (str(body.mode) !== "subscription") throw new FakeError(400, "invalid_request_error", "The fake only supports mode=subscription.", "parameter_invalid", "mode");
      const lines = list(body.line_items).map(obj);
      const first = lines[0];
      const quantity = Number(str(first?.quantity));
      if (lines.length !== 1 || !first || !Number.isInteger(quantity) || quantity < 1) {
        throw new FakeError(400, "invalid_request_error", "Exactly one line item with a positive quantity is required.", "parameter_invalid", "line_items");
      }
      const price = str(first.price) ?? "";
      priceObject(price);
      const successUrl = str(body.success_url);
      if (!successUrl) throw new FakeError(400, "invalid_request_error", "Missing required param: success_url.", "parameter_missing", "success_url");
      const id = newId("cs_test");
      const s: Json = {
        id,
        object: "checkout.session",
        mode: "subscription",
        status: "open",
        payment_status: "unpaid",
        customer,
        client_reference_id: str(body.client_reference_id) ?? null,
        metadata: stringMap(body.metadata),
        subscription: null,
        invoice: null,
        success_url: successUrl,
        cancel_url: str(body.cancel_url) ?? null,
        url: `${baseUrl}/pay/${id}`,
        created: now(),
        expires_at: now() + 24 * 60 * 60,
        livemode: false,
        _line: { price, quantity },
        _subscriptionMetadata: stringMap(obj(body.subscription_data).metadata),
      };
      sessions.set(id, s);
      return [200, publicSession(s)];
    }
    if ((m = /^\/v1\/checkout\/sessions\/([\w]+)$/.exec(path)) && method === "GET") {
      const s = sessions.get(m[1]!);
      if (!s) throw missing("checkout.session", m[1]!);
      return [200, publicSession(s)];
    }
    if ((m = /^\/v1\/subscriptions\/([\w]+)$/.exec(path))) {
      const sub = subscriptions.get(m[1]!);
      if (!sub) throw missing("subscription", m[1]!);
      if (method === "GET") return [200, sub];
      if (method === "POST") return [200, updateSubscription(sub, body)];
      if (method === "DELETE") {
        if (sub.status !== "canceled") {
          sub.status = "canceled";
          sub.canceled_at = now();
          sub.ended_at = now();
          emit("customer.subscription.deleted", sub);
        }
        return [200, sub];
      }
    }
    if (method === "GET" && path === "/v1/invoices") {
      const customer = query.get("customer");
      const subscription = query.get("subscription");
      const limit = Math.min(100, Number(query.get("limit") ?? 10) || 10);
      const data = [...invoices.values()]
        .filter((i) => (!customer || i.customer === customer) && (!subscription || i.parent?.subscription_details?.subscription === subscription))
        .reverse()
        .slice(0, limit);
      return [200, listResponse("/v1/invoices", data)];
    }
    if ((m = /^\/v1\/invoices\/([\w]+)(\/pay)?$/.exec(path))) {
      const inv = invoices.get(m[1]!);
      if (!inv) throw missing("invoice", m[1]!);
      if (method === "GET" && !m[2]) return [200, inv];
      if (method === "POST" && m[2]) {
        if (inv.status !== "open") throw new FakeError(400, "invalid_request_error", "Invoice is already paid", "invoice_not_open");
        if (!charge(inv)) throw new FakeError(402, "card_error", "Your card was declined. (The payments fake was told to fail payments.)", "card_declined");
        return [200, inv];
      }
    }
    if ((m = /^\/v1\/prices\/([\w]+)$/.exec(path)) && method === "GET") return [200, priceObject(m[1]!)];
    throw new FakeError(404, "invalid_request_error", `Unrecognized request URL (${method}: ${path}). The payments fake only implements what Tagloom uses.`);
  }

  function publicSession(s: Json): Json {
    const { _line, _subscriptionMetadata, declined, ...rest } = s;
    void _line;
    void _subscriptionMetadata;
    void declined;
    return rest;
  }

  const server = http.createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on("data", (c: Buffer) => chunks.push(c));
    req.on("end", () => {
      const url = new URL(req.url ?? "/", "http://localhost");
      const text = Buffer.concat(chunks).toString("utf8");
      // Saved before answering, so whoever saw the answer can restart the fake and find the change.
      const save = () => {
        if (req.method !== "GET") persist();
      };
      const sendJson = (status: number, body: unknown) => {
        save();
        res.writeHead(status, { "Content-Type": "application/json", "Request-Id": newId("req") });
        res.end(JSON.stringify(body));
      };
      const sendHtml = (status: number, html: string) => {
        save();
        res.writeHead(status, { "Content-Type": "text/html; charset=utf-8" });
        res.end(html);
      };
      void (async () => {
        try {
          const page = /^\/pay\/([\w]+)$/.exec(url.pathname);
          if (page) {
            const s = sessions.get(page[1]!);
            if (!s) return sendHtml(404, "<!doctype html><title>Not found</title><p>No such test checkout.</p>");
            if (req.method === "POST") {
              const result = payCheckout(s.id);
              if (result.ok && result.redirect) {
                save();
                res.writeHead(303, { Location: result.redirect });
                return res.end();
              }
            }
            const line = s._line as { price: string; quantity: number };
            const price = priceObject(line.price);
            return sendHtml(200, renderCheckoutPage({ sessionId: s.id, seats: line.quantity, unitAmount: price.unit_amount, currency: price.currency, status: s.status, declined: Boolean(s.declined), cancelUrl: s.cancel_url }));
          }
          if (url.pathname.startsWith("/_control/")) return sendJson(...handleControl(req.method ?? "GET", url.pathname, text));
          if (!url.pathname.startsWith("/v1/")) return sendJson(404, { error: { type: "invalid_request_error", message: "Not found" } });
          if (req.headers.authorization !== `Bearer ${secretKey}`) {
            return sendJson(401, { error: { type: "invalid_request_error", message: "Invalid API Key provided." } });
          }
          const [status, body] = await handleApi(req.method ?? "GET", url.pathname, url.searchParams, parseFormBody(text));
          sendJson(status, body);
        } catch (err) {
          if (err instanceof FakeError) {
            return sendJson(err.status, { error: { type: err.type, message: err.message, code: err.code, param: err.param } });
          }
          sendJson(500, { error: { type: "api_error", message: (err as Error).message } });
        }
      })();
    });
  });

  /** Switches for tests and for trying failures in the browser (POST JSON). */
  function handleControl(method: string, path: string, text: string): [number, Json] {
    let body: Json = {};
    try {
      body = text ? (JSON.parse(text) as Json) : {};
    } catch {
      return [400, { error: { type: "invalid_request_error", message: "Body must be JSON." } }];
    }
    if (method === "POST" && path === "/_control/fail-payments") {
      failPayments = body.fail === true;
      return [200, { failPayments }];
    }
    const m = /^\/_control\/subscriptions\/([\w]+)\/end-period$/.exec(path);
    if (method === "POST" && m) {
      endPeriod(m[1]!);
      return [200, subscriptions.get(m[1]!)!];
    }
    if (method === "GET" && path === "/_control/state") {
      return [200, { failPayments, mode, subscriptions: [...subscriptions.values()], invoices: [...invoices.values()], deliveries: deliveryLog }];
    }
    return [404, { error: { type: "invalid_request_error", message: "Not found" } }];
  }

  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(options.port ?? 0, "127.0.0.1", () => resolve());
  });
  const port = (server.address() as AddressInfo).port;
  baseUrl = `http://127.0.0.1:${port}`;

  return {
    port,
    url: baseUrl,
    setWebhookUrl: (u) => void (webhookUrl = u),
    setFailPayments: (f) => void (failPayments = f),
    setDeliveryMode: (m) => void (mode = m),
    async deliverHeld(order = "as_created") {
      const batch = heldEvents.splice(0, heldEvents.length);
      if (order === "reverse") batch.reverse();
      const out: Delivery[] = [];
      for (const e of batch) out.push(await send(e));
      return out;
    },
    async redeliver(eventId) {
      const e = events.find((x) => x.id === eventId);
      if (!e) throw new Error(`no event ${eventId}`);
      return send(e);
    },
    settled: async () => {
      let current: Promise<unknown>;
      do {
        current = chain;
        await current;
      } while (current !== chain);
    },
    events: () => [...events],
    deliveries: () => [...deliveryLog],
    held: () => [...heldEvents],
    endPeriod: (id) => {
      endPeriod(id);
      persist();
    },
    subscription: (id) => subscriptions.get(id),
    payCheckout: (id) => {
      const result = payCheckout(id);
      persist();
      return result;
    },
    async stop() {
      await chain.catch(() => undefined);
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
    },
  };
}
