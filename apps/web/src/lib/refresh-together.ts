import { type QueryClient, type QueryFunction, type QueryKey, notifyManager } from "@tanstack/react-query";

type Fetchable = { queryKey: QueryKey; queryFn: QueryFunction; meta?: Record<string, unknown> };

export type Answer = { queryKey: QueryKey; data: unknown };
export type RefreshOptions = {
  /** Queries to fetch even if no screen shows them yet. */
  extra?: Fetchable[];
  /**
   * Whether one round of answers tells one story. The requests of a round run side by side and
   * the server may change between them; a round that disagrees is fetched again (a few times).
   */
  agree?: (answers: Answer[]) => boolean;
};

/**
 * Fetches every active query under `prefix` that `include` accepts, plus `extra` ones, each with
 * its own query function, then publishes all the answers at once, so no screen shows one answer
 * beside an older one. A query whose fetch fails is refetched the ordinary way instead (and shows
 * its own error). Resolves once the screens have been told.
 */
export async function refreshTogether(qc: QueryClient, prefix: QueryKey, include: (key: QueryKey) => boolean, { extra = [], agree }: RefreshOptions = {}): Promise<void> {
  const active: Fetchable[] = qc
    .getQueryCache()
    .findAll({ queryKey: prefix, type: "active" })
    .filter((q) => include(q.queryKey) && typeof q.options.queryFn === "function")
    .map((q) => ({ queryKey: q.queryKey, queryFn: q.options.queryFn as QueryFunction, meta: q.meta }));
  const hashes = new Set(active.map((q) => JSON.stringify(q.queryKey)));
  const all = [...active, ...extra.filter((q) => !hashes.has(JSON.stringify(q.queryKey)))];
  const round = () =>
    Promise.all(
      all.map(async (q) => {
        try {
          const data: unknown = await q.queryFn({ client: qc, queryKey: q.queryKey, signal: new AbortController().signal, meta: q.meta, pageParam: undefined, direction: "forward" });
          return { q, ok: true as const, data };
        } catch {
          return { q, ok: false as const, data: undefined };
        }
      }),
    );
  let answers = await round();
  for (let attempt = 1; attempt < 3 && agree && !agree(answers.filter((a) => a.ok).map((a) => ({ queryKey: a.q.queryKey, data: a.data }))); attempt++) answers = await round();
  notifyManager.batch(() => {
    for (const a of answers) if (a.ok) qc.setQueryData(a.q.queryKey, a.data);
  });
  // The screens hear of the answers on the notify manager's next tick; wait for it, so what the
  // caller does next (such as showing a new upload's results) comes after, not before.
  await new Promise<void>((resolve) => notifyManager.schedule(resolve));
  await Promise.all(answers.filter((a) => !a.ok).map((a) => qc.invalidateQueries({ queryKey: a.q.queryKey, exact: true })));
}
