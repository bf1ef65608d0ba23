import { type Health, healthSchema } from "@tagloom/contracts";
import { queryOptions, useQuery } from "@tanstack/react-query";
import { ApiError, api } from "@/lib/api-client";

async function getHealth(): Promise<Health> {
  try {
    return healthSchema.parse(await api.get<unknown>("/health"));
  } catch (err) {
    // The API answers 503 with the same body shape when the database is down.
    if (err instanceof ApiError && err.status === 503) return { ok: false, db: "down" };
    throw err;
  }
}

export const healthQueryOptions = () =>
  queryOptions({ queryKey: ["health"], queryFn: getHealth, refetchInterval: 30_000, retry: false });

export function useHealth() {
  return useQuery(healthQueryOptions());
}
