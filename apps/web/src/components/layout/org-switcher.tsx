import type { Membership } from "@tagloom/contracts";
import { roleLabels } from "@tagloom/contracts";
import { useNavigate } from "react-router";
import { paths } from "@/config/paths";

const NEW = "__new__";

/** Moves between the organizations the user belongs to, or to creating a new one. */
export function OrgSwitcher({ memberships, current }: { memberships: Membership[]; current: string }) {
  const navigate = useNavigate();
  return (
    <label className="flex items-center gap-2 text-sm">
      <span className="sr-only">Organization</span>
      <select
        aria-label="Organization"
        className="w-32 max-w-64 truncate rounded-md sm:w-auto border border-ink-200 bg-white px-2 py-1.5 text-sm font-medium text-ink-800"
        value={current}
        onChange={(e) => navigate(e.target.value === NEW ? paths.newOrganization.build() : paths.org.root.build(e.target.value))}
      >
        {memberships.map((m) => (
          <option key={m.organizationId} value={m.organizationId}>
            {m.organizationName} · {roleLabels[m.role]}
          </option>
        ))}
        <option value={NEW}>New organization…</option>
      </select>
    </label>
  );
}
