import type { Me } from "@tagloom/contracts";
import { queryOptions, useQuery } from "@tanstack/react-query";
import { ApiError, api } from "@/lib/api-client";

/** The signed-in user and their memberships, or null when nobody is signed in. */
export async function getMe(): Promise<Me | null> {
  try {
    return await api.get<Me>("/me");
  } catch (err) {
    if (err instanceof ApiError && err.status === 401) return null;
    throw err;
  }
}

export const meQueryOptions = () => queryOptions({ queryKey: ["me"], queryFn: getMe, staleTime: 60_000 });

export function useMe() {
  return useQuery(meQueryOptions());
}
