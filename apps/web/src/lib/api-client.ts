/** An error answer of the API: `{ error: { code, message, details } }` plus the HTTP status. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details: unknown = null,
    /** The caller shows this failure on its own screen (RequestOptions.shownByCaller): no global toast. */
    readonly shownByCaller = false,
  ) {
    super(message);
    this.name = "ApiError";
  }

  /** Field messages of a 400, keyed by field path. */
  get fieldErrors(): Record<string, string[]> {
    const d = this.details as { fields?: Record<string, string[]> } | null;
    return d?.fields ?? {};
  }
}

type Query = Record<string, string | number | boolean | undefined | null>;
type RequestOptions = {
  query?: Query;
  body?: unknown;
  signal?: AbortSignal;
  headers?: Record<string, string>;
  /** The caller shows network and server faults itself (e.g. the autosave's status line), so the global toast skips them; 401 handling still runs. */
  shownByCaller?: boolean;
};

const listeners = new Set<(err: ApiError) => void>();
/** Subscribes to every error answer (the app shows toasts and handles 401 there). */
export function onApiError(listener: (err: ApiError) => void): () => void {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

function buildUrl(path: string, query?: Query): string {
  const qs = new URLSearchParams();
  for (const [k, v] of Object.entries(query ?? {})) if (v !== undefined && v !== null && v !== "") qs.set(k, String(v));
  const s = qs.toString();
  return `/api${path}${s ? `?${s}` : ""}`;
}

async function request<T>(method: string, path: string, opts: RequestOptions = {}): Promise<T> {
  const isForm = typeof FormData !== "undefined" && opts.body instanceof FormData;
  let res: Response;
  try {
    res = await fetch(buildUrl(path, opts.query), {
      method,
      credentials: "same-origin",
      signal: opts.signal,
      headers: {
        Accept: "application/json",
        ...(opts.body !== undefined && !isForm ? { "Content-Type": "application/json" } : {}),
        ...opts.headers,
      },
      body: opts.body === undefined ? undefined : isForm ? (opts.body as FormData) : JSON.stringify(opts.body),
    });
  } catch (cause) {
    if (cause instanceof DOMException && cause.name === "AbortError") throw cause;
    const err = new ApiError(0, "network", "Cannot reach the server. Check your connection and try again.", null, opts.shownByCaller === true);
    listeners.forEach((l) => l(err));
    throw err;
  }
  if (res.status === 204) return undefined as T;
  const text = await res.text();
  let body: unknown = null;
  try {
    body = text ? JSON.parse(text) : null;
  } catch {
    body = null;
  }
  if (!res.ok) {
    const e = (body as { error?: { code?: string; message?: string; details?: unknown } } | null)?.error;
    const err = new ApiError(res.status, e?.code ?? "http_error", e?.message ?? `The server answered ${res.status}.`, e?.details ?? null, opts.shownByCaller === true);
    listeners.forEach((l) => l(err));
    throw err;
  }
  return body as T;
}

/** The one way the web app talks HTTP to the API (paths are relative to /api). */
export const api = {
  get: <T>(path: string, opts?: Omit<RequestOptions, "body">) => request<T>("GET", path, opts),
  post: <T>(path: string, body?: unknown, opts?: RequestOptions) => request<T>("POST", path, { ...opts, body }),
  put: <T>(path: string, body?: unknown, opts?: RequestOptions) => request<T>("PUT", path, { ...opts, body }),
  patch: <T>(path: string, body?: unknown, opts?: RequestOptions) => request<T>("PATCH", path, { ...opts, body }),
  delete: <T>(path: string, opts?: RequestOptions) => request<T>("DELETE", path, opts),
};
