import { MutationCache, QueryClient } from "@tanstack/react-query";
import { ApiError } from "@/lib/api-client";

declare module "@tanstack/react-query" {
  interface Register {
    mutationMeta: { ownError?: boolean };
  }
}

/** `meta` for a mutation whose screen shows its error itself (a form notice, a field, its own toast). */
export const ownErrorMeta = { ownError: true } as const;

const ownErrors = new WeakSet<object>();

/**
 * Whether the error came from a mutation marked with `ownErrorMeta`. The API client reports an
 * error before the mutation sees it; by the next task the mutation cache has recorded it here.
 */
export function isOwnError(err: unknown): boolean {
  return typeof err === "object" && err !== null && ownErrors.has(err);
}

/** Builds the app's query client: no retries on answers that will not change (4xx). */
export function createQueryClient(): QueryClient {
  return new QueryClient({
    mutationCache: new MutationCache({
      onError: (err, _vars, _ctx, mutation) => {
        if (mutation.meta?.ownError && typeof err === "object" && err !== null) ownErrors.add(err);
      },
    }),
    defaultOptions: {
      queries: {
        staleTime: 15_000,
        refetchOnWindowFocus: false,
        retry: (count, err) => !(err instanceof ApiError && err.status >= 400 && err.status < 500) && count < 2,
      },
      mutations: { retry: false },
    },
  });
}
