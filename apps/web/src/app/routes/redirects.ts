import type { Me } from "@tagloom/contracts";
import { paths } from "@/config/paths";

/** Where a signed-in user lands: their first organization (or the page to create one). */
export function homeFor(me: Me): string {
  const first = me.memberships[0];
  return first ? paths.org.root.build(first.organizationId) : paths.newOrganization.build();
}

/** Only same-site paths may be a redirect target after sign-in. */
export function safeNext(next: string | null): string | null {
  return next && next.startsWith("/") && !next.startsWith("//") ? next : null;
}
