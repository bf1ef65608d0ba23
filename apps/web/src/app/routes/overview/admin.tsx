import { auditActionLabel } from "@tagloom/contracts";
import { Skeleton } from "@/components/ui/card";
import { paths } from "@/config/paths";
import { useAudit } from "@/features/audit/api/get-audit";
import { useBilling } from "@/features/billing/api/get-billing";
import { formatAgo } from "@/lib/dates";
import { OverviewSection, ProgressLine } from "./section";

/** Seats in use against the plan's limit. */
export function SeatsSection({ orgId }: { orgId: string }) {
  const billing = useBilling(orgId);
  const b = billing.data;
  return (
    <OverviewSection title="Seats" link={{ to: paths.org.billing.build(orgId), text: "Billing" }}>
      {billing.isPending ? (
        <Skeleton rows={2} />
      ) : billing.isError ? (
        <p className="text-sm text-rust-500">{billing.error.message}</p>
      ) : (
        <div className="space-y-2 text-sm">
          <ProgressLine done={b!.seatsUsed} total={b!.seatLimit} label="Seats in use" />
          <p className="text-ink-700">
            {b!.members} {b!.members === 1 ? "member" : "members"} and {b!.pendingInvitations} pending {b!.pendingInvitations === 1 ? "invitation" : "invitations"} use {b!.seatsUsed} of{" "}
            {b!.seatLimit} seats on the {b!.plan} plan.
          </p>
          {b!.paymentFailed ? <p className="text-rust-500">The last payment was declined.</p> : null}
        </div>
      )}
    </OverviewSection>
  );
}

/** The newest audit events, in words. */
export function RecentAuditSection({ orgId }: { orgId: string }) {
  const audit = useAudit(orgId, {});
  const events = audit.data?.pages[0]?.items.slice(0, 6) ?? [];
  return (
    <OverviewSection title="Recent activity" link={{ to: paths.org.audit.build(orgId), text: "Audit log" }}>
      {audit.isPending ? (
        <Skeleton rows={3} />
      ) : audit.isError ? (
        <p className="text-sm text-rust-500">{audit.error.message}</p>
      ) : events.length === 0 ? (
        <p className="text-sm text-ink-500">Nothing recorded yet.</p>
      ) : (
        <ul className="divide-y divide-ink-50 text-sm">
          {events.map((e) => (
            <li key={e.id} className="flex flex-wrap justify-between gap-x-3 py-1.5">
              <span className="min-w-0 text-ink-800">
                {auditActionLabel(e.action)}
                {e.targetLabel && e.targetLabel !== e.actor ? <span className="text-ink-500"> · {e.targetLabel}</span> : null}
                <span className="block text-xs break-all text-ink-500">{e.actor}</span>
              </span>
              <span className="shrink-0 text-ink-500">{formatAgo(e.createdAt)}</span>
            </li>
          ))}
        </ul>
      )}
    </OverviewSection>
  );
}
