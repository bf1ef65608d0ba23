/** Polls `check` until it returns a value (not null), or fails after `timeoutMs` with `what` in the message. */
export async function waitFor<T>(what: string, check: () => Promise<T | null>, timeoutMs: number, everyMs = 300): Promise<T> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const v = await check();
    if (v !== null) return v;
    if (Date.now() > until) {
      throw new Error(`demo data: gave up waiting for ${what} after ${Math.round(timeoutMs / 1000)} s (is a worker process running? npm start runs one)`);
    }
    await new Promise((r) => setTimeout(r, everyMs));
  }
}
