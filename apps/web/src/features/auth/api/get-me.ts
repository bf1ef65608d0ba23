import type { Me, SessionView } from "@tagloom/contracts";
import { queryOptions, useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";

/**
 * The signed-in user and their memberships, or null when nobody is signed in. Asks the session
 * route, which answers 200 either way, so a signed-out page load logs no failed request.
 */
export async function getMe(): Promise<Me | null> {
  return (await api.get<SessionView>("/auth/session")).me;
}

export const meQueryOptions = () => queryOptions({ queryKey: ["me"], queryFn: getMe, staleTime: 60_000 });

export function useMe() {
  return useQuery(meQueryOptions());
}
