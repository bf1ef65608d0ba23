import { type Invitation, roleLabels } from "@tagloom/contracts";
import { createColumnHelper, flexRender } from "@tanstack/react-table";
import { useDataTable } from "@/components/ui/use-data-table";
import { useMemo, useState } from "react";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/card";
import { DataTable } from "@/components/ui/data-table";
import { useToast } from "@/components/ui/toaster";
import { cn } from "@/lib/cn";
import { SeatLimitNotice, isSeatLimitError } from "./seat-limit-notice";
import { useResendInvitation, useRevokeInvitation } from "../api/invitations";
import { formatDate, formatDateTime } from "@/lib/dates";

const col = createColumnHelper<Invitation>();
const statusText: Record<Invitation["status"], string> = { pending: "Waiting", accepted: "Joined", revoked: "Withdrawn", expired: "Expired" };

export function InvitationsTable({ orgId, invitations }: { orgId: string; invitations: Invitation[] }) {
  const resend = useResendInvitation(orgId);
  const revoke = useRevokeInvitation(orgId);
  const toast = useToast();
  const [error, setError] = useState<string | null>(null);
  const [seatError, setSeatError] = useState<string | null>(null);
  const columns = useMemo(
    () => [
      col.accessor("email", { header: "E-mail" }),
      col.accessor("role", { header: "Role", cell: (c) => roleLabels[c.getValue()] }),
      col.accessor("status", {
        header: "Status",
        cell: (c) => (
          <span
            className={cn(
              "rounded-full px-2 py-0.5 text-xs font-medium",
              c.getValue() === "pending" && "bg-thread-100 text-thread-700",
              c.getValue() === "accepted" && "bg-moss-500/10 text-moss-500",
              (c.getValue() === "revoked" || c.getValue() === "expired") && "bg-ink-50 text-ink-500",
            )}
          >
            {statusText[c.getValue()]}
          </span>
        ),
      }),
      col.accessor("lastSentAt", {
        header: "Last sent",
        cell: (c) => `${formatDateTime(c.getValue())}${c.row.original.sendCount > 1 ? ` (${c.row.original.sendCount}×)` : ""}`,
      }),
      col.accessor("expiresAt", { header: "Expires", cell: (c) => formatDate(c.getValue()) }),
      col.display({
        id: "actions",
        header: () => <span className="sr-only">Actions</span>,
        cell: (c) => {
          const inv = c.row.original;
          if (inv.status !== "pending" && inv.status !== "expired") return null;
          return (
            <span className="flex justify-end gap-1">
              <Button
                size="sm"
                variant="ghost"
                onClick={() => {
                  setError(null);
                  setSeatError(null);
                  resend.mutate(inv.id, {
                    onSuccess: () => toast.show(`Sent again to ${inv.email}.`, "success"),
                    // Sending an expired invitation again takes a seat, which may not be there.
                    onError: (e) => (isSeatLimitError(e) ? setSeatError(e.message) : setError(e.message)),
                  });
                }}
              >
                Send again
              </Button>
              {inv.status === "pending" ? (
                <Button size="sm" variant="ghost" onClick={() => revoke.mutate(inv.id, { onError: (e) => setError(e.message) })}>
                  Withdraw
                </Button>
              ) : null}
            </span>
          );
        },
      }),
    ],
    [resend, revoke, toast],
  );
  const table = useDataTable({ data: invitations, columns, getRowId: (i) => i.id });
  return (
    <div className="space-y-3">
      {error ? <Notice tone="error">{error}</Notice> : null}
      {seatError ? <SeatLimitNotice orgId={orgId} message={seatError} /> : null}
      <DataTable table={table} flexRender={flexRender} caption="Invitations" />
    </div>
  );
}
