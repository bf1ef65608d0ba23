import { type Ability, can, roleLabels } from "@tagloom/contracts";
import type { ReactNode } from "react";
import { Link } from "react-router";
import { paths } from "@/config/paths";
import { useCurrentOrg } from "@/features/orgs/hooks/use-current-org";

/** Said instead of a screen the member's role may not use (the API refuses it too). */
export function NotAllowed({ what }: { what: string }) {
  const org = useCurrentOrg();
  return (
    <section className="max-w-xl rounded-lg border border-ink-100 bg-white p-6" data-testid="not-allowed">
      <h1 className="text-lg font-semibold text-ink-900">Not available to your role</h1>
      <p className="mt-2 text-sm text-ink-700">
        {what} As {roleLabels[org.role].toLowerCase() === "admin" ? "an admin" : `a${/^[aeiou]/i.test(roleLabels[org.role]) ? "n" : ""} ${roleLabels[org.role].toLowerCase()}`} in{" "}
        {org.organizationName} you cannot open this page. Ask an admin if you need it.
      </p>
      <p className="mt-4 text-sm">
        <Link to={paths.org.root.build(org.organizationId)} className="font-medium text-ink-700 underline">
          Back to the overview
        </Link>
      </p>
    </section>
  );
}

/** Shows its children only to roles with the ability; everyone else sees "not available". */
export function RequireAbility({ ability, what, children }: { ability: Ability; what: string; children: ReactNode }) {
  const org = useCurrentOrg();
  return can(org.role, ability) ? children : <NotAllowed what={what} />;
}
