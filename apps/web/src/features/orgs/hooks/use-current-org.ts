import type { Membership } from "@tagloom/contracts";
import { useParams } from "react-router";
import { useMe } from "@/features/auth/api/get-me";

/**
 * The organization of the URL and the signed-in user's role in it. Only call it below the
 * organization layout, which guarantees both exist.
 */
export function useCurrentOrg(): Membership & { userId: string } {
  const { orgId } = useParams();
  const me = useMe().data;
  const m = me?.memberships.find((x) => x.organizationId === orgId);
  if (!me || !m) throw new Error("useCurrentOrg used outside an organization the user belongs to");
  return { ...m, userId: me.user.id };
}
