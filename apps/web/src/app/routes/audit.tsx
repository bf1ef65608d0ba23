import { type AuditEvent, auditActionLabel } from "@tagloom/contracts";
import { createColumnHelper, flexRender } from "@tanstack/react-table";
import { useDataTable } from "@/components/ui/use-data-table";
import { useState } from "react";
import { DataTable } from "@/components/ui/data-table";
import { Button } from "@/components/ui/button";
import { EmptyState, Notice, PageHeader, Skeleton } from "@/components/ui/card";
import { Field, Input, Select } from "@/components/ui/field";
import { type AuditFilters, useAudit } from "@/features/audit/api/get-audit";
import { useCurrentOrg } from "@/features/orgs/hooks/use-current-org";
import { RequireAbility } from "@/components/layout/not-allowed";
import { formatDateTime } from "@/lib/dates";
import { AuditDetails } from "@/features/audit/components/audit-details";

/** Turns a yyyy-mm-dd date input into the ISO instant of that local midnight. */
function dayStart(value: string, addDays = 0): string | undefined {
  if (!value) return undefined;
  const d = new Date(`${value}T00:00:00`);
  d.setDate(d.getDate() + addDays);
  return d.toISOString();
}

export function AuditRoute() {
  return (
    <RequireAbility ability="viewAudit" what="The audit log is for admins.">
      <AuditScreen />
    </RequireAbility>
  );
}

function AuditScreen() {
  const org = useCurrentOrg();
  const [action, setAction] = useState("");
  const [actor, setActor] = useState("");
  const [from, setFrom] = useState("");
  const [to, setTo] = useState("");
  const filters: AuditFilters = { action: action || undefined, actor: actor.trim() || undefined, from: dayStart(from), to: dayStart(to, 1) };
  const audit = useAudit(org.organizationId, filters);
  const events = audit.data?.pages.flatMap((p) => p.items) ?? [];
  const actions = audit.data?.pages[0]?.actions ?? [];
  return (
    <div className="max-w-6xl space-y-6">
      <PageHeader title="Audit log" subtitle="Who did what, when, and to which object. Newest first." />
      <div className="grid gap-3 rounded-lg border border-ink-100 bg-white p-4 sm:grid-cols-4">
        <Field label="Action">
          {(id) => (
            <Select id={id} value={action} onChange={(e) => setAction(e.target.value)}>
              <option value="">All actions</option>
              {actions.map((a) => (
                <option key={a} value={a}>
                  {auditActionLabel(a)}
                </option>
              ))}
            </Select>
          )}
        </Field>
        <Field label="Who (e-mail contains)">{(id) => <Input id={id} value={actor} onChange={(e) => setActor(e.target.value)} />}</Field>
        <Field label="From">{(id) => <Input id={id} type="date" value={from} onChange={(e) => setFrom(e.target.value)} />}</Field>
        <Field label="To (inclusive)">{(id) => <Input id={id} type="date" value={to} onChange={(e) => setTo(e.target.value)} />}</Field>
      </div>
      {audit.isPending ? (
        <Skeleton shape="table" />
      ) : audit.isError ? (
        <Notice tone="error">{audit.error.message}</Notice>
      ) : events.length === 0 ? (
        <EmptyState title="No events match these filters" />
      ) : (
        <AuditTable events={events} />
      )}
      {audit.hasNextPage ? (
        <Button variant="secondary" busy={audit.isFetchingNextPage} onClick={() => void audit.fetchNextPage()}>
          Show older events
        </Button>
      ) : null}
    </div>
  );
}

const col = createColumnHelper<AuditEvent>();
const columns = [
  col.accessor("createdAt", { header: "When", cell: (c) => <span className="whitespace-nowrap text-ink-500">{formatDateTime(c.getValue())}</span> }),
  col.accessor("actor", { header: "Who", cell: (c) => <span className="whitespace-nowrap">{c.getValue()}</span> }),
  col.accessor("action", { header: "Action", cell: (c) => <span title={c.getValue()}>{auditActionLabel(c.getValue())}</span> }),
  col.display({ id: "object", header: "Object", cell: (c) => c.row.original.targetLabel ?? c.row.original.targetId ?? "—" }),
  col.accessor("details", {
    header: "Details",
    cell: (c) => <AuditDetails details={c.getValue()} ip={c.row.original.ip} />,
  }),
];

function AuditTable({ events }: { events: AuditEvent[] }) {
  const table = useDataTable({ data: events, columns, getRowId: (e) => e.id });
  return <DataTable table={table} flexRender={flexRender} caption="Audit events" />;
}
