import { type Member, type Role, roleLabels, roles } from "@tagloom/contracts";
import { createColumnHelper, flexRender } from "@tanstack/react-table";
import { useDataTable } from "@/components/ui/use-data-table";
import { useMemo, useState } from "react";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/card";
import { DataTable } from "@/components/ui/data-table";
import { useChangeMemberRole, useRemoveMember } from "../api/members";
import { formatDate } from "@/lib/dates";

const col = createColumnHelper<Member>();

/** Everyone in the organization; admins change roles and remove members here. */
export function MembersTable({ orgId, members, canManage, currentUserId }: { orgId: string; members: Member[]; canManage: boolean; currentUserId: string }) {
  const changeRole = useChangeMemberRole(orgId);
  const remove = useRemoveMember(orgId);
  const [error, setError] = useState<string | null>(null);
  const [confirming, setConfirming] = useState<string | null>(null);

  const columns = useMemo(
    () => [
      col.accessor("name", { header: "Name", cell: (c) => <span className="font-medium text-ink-900">{c.getValue()}</span> }),
      col.accessor("email", { header: "E-mail" }),
      col.accessor("role", {
        header: "Role",
        cell: (c) =>
          canManage ? (
            <select
              aria-label={`Role of ${c.row.original.name}`}
              className="rounded-md border border-ink-200 bg-white px-2 py-1 text-sm"
              value={c.getValue()}
              disabled={changeRole.isPending}
              onChange={(e) => {
                setError(null);
                changeRole.mutate({ userId: c.row.original.userId, role: e.target.value as Role }, { onError: (err) => setError(err.message) });
              }}
            >
              {roles.map((r) => (
                <option key={r} value={r}>
                  {roleLabels[r]}
                </option>
              ))}
            </select>
          ) : (
            roleLabels[c.getValue()]
          ),
      }),
      col.accessor("joinedAt", { header: "Joined", cell: (c) => formatDate(c.getValue()) }),
      col.display({
        id: "actions",
        header: () => <span className="sr-only">Actions</span>,
        cell: (c) => {
          const m = c.row.original;
          if (!canManage) return null;
          if (confirming === m.userId) {
            return (
              <span className="flex items-center justify-end gap-2">
                <span className="text-xs text-ink-500">{m.userId === currentUserId ? "Leave the organization?" : `Remove ${m.name}?`}</span>
                <Button
                  size="sm"
                  variant="danger"
                  busy={remove.isPending}
                  onClick={() =>
                    remove.mutate(m.userId, {
                      onError: (err) => setError(err.message),
                      onSettled: () => setConfirming(null),
                    })
                  }
                >
                  Remove
                </Button>
                <Button size="sm" variant="ghost" onClick={() => setConfirming(null)}>
                  Keep
                </Button>
              </span>
            );
          }
          return (
            <span className="flex justify-end">
              <Button size="sm" variant="ghost" onClick={() => setConfirming(m.userId)}>
                Remove…
              </Button>
            </span>
          );
        },
      }),
    ],
    [canManage, changeRole, remove, confirming, currentUserId],
  );
  const table = useDataTable({ data: members, columns, getRowId: (m) => m.userId });
  return (
    <div className="space-y-3">
      {error ? <Notice tone="error">{error}</Notice> : null}
      <DataTable table={table} flexRender={flexRender} caption="Members" />
    </div>
  );
}
