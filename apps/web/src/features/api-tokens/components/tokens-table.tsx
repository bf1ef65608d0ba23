import type { ApiToken } from "@tagloom/contracts";
import { createColumnHelper, flexRender } from "@tanstack/react-table";
import { useDataTable } from "@/components/ui/use-data-table";
import { useMemo, useState } from "react";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/card";
import { DataTable } from "@/components/ui/data-table";
import { useRevokeApiToken } from "../api/revoke-api-token";
import { formatDate, formatDateTime } from "@/lib/dates";

const col = createColumnHelper<ApiToken>();
const when = (iso: string | null) => (iso ? formatDateTime(iso) : "never");

export function TokensTable({ orgId, tokens }: { orgId: string; tokens: ApiToken[] }) {
  const revoke = useRevokeApiToken(orgId);
  const [error, setError] = useState<string | null>(null);
  const columns = useMemo(
    () => [
      col.accessor("name", { header: "Name", cell: (c) => <span className="font-medium text-ink-900">{c.getValue()}</span> }),
      col.accessor("prefix", { header: "Starts with", cell: (c) => <code className="font-mono text-xs">{c.getValue()}…</code> }),
      col.accessor("createdAt", { header: "Created", cell: (c) => `${when(c.getValue())}${c.row.original.createdBy ? ` by ${c.row.original.createdBy.replace(/ <.*>$/, "")}` : ""}` }),
      col.accessor("lastUsedAt", { header: "Last used", cell: (c) => when(c.getValue()) }),
      col.display({
        id: "actions",
        header: () => <span className="sr-only">Actions</span>,
        cell: (c) => {
          const t = c.row.original;
          if (t.revokedAt) return <span className="text-xs text-ink-500">Revoked {formatDate(t.revokedAt)}</span>;
          return (
            <span className="flex justify-end">
              <Button
                size="sm"
                variant="ghost"
                aria-label={`Revoke ${t.name}`}
                onClick={() => {
                  if (!window.confirm(`Revoke “${t.name}”? Programs using it get 401 from then on.`)) return;
                  setError(null);
                  revoke.mutate(t.id, { onError: (e) => setError(e.message) });
                }}
              >
                Revoke
              </Button>
            </span>
          );
        },
      }),
    ],
    [revoke],
  );
  const table = useDataTable({ data: tokens, columns, getRowId: (t) => t.id });
  return (
    <div className="space-y-3">
      {error ? <Notice tone="error">{error}</Notice> : null}
      <DataTable table={table} flexRender={flexRender} caption="API tokens" rowClassName={(t) => (t.revokedAt ? "text-ink-500" : undefined)} />
    </div>
  );
}
