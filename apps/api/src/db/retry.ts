/** PostgreSQL's SQLSTATEs for a transaction it aborted so that another could go on. */
const RETRYABLE = new Set(["40P01", "40001"]); // deadlock_detected, serialization_failure

/** True when PostgreSQL aborted the statement's transaction over a deadlock or a serialization failure. */
export function isRetryableConflict(err: unknown): boolean {
  return typeof err === "object" && err !== null && RETRYABLE.has((err as { code?: unknown }).code as string);
}

/**
 * Runs `work` (one statement or a whole transaction, never a part of an open one) again when
 * PostgreSQL aborted it over a deadlock or a serialization failure, after a short random pause.
 * PostgreSQL's manual (§13.2, "Transaction Isolation", and §13.3.4, "Deadlocks") says
 * applications must be ready to retry such transactions; the work it aborted changed nothing.
 */
export async function retryOnConflict<T>(work: () => Promise<T>, attempts = 4): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await work();
    } catch (err) {
      if (attempt >= attempts || !isRetryableConflict(err)) throw err;
      await new Promise((r) => setTimeout(r, 25 * attempt + Math.random() * 50));
    }
  }
}
