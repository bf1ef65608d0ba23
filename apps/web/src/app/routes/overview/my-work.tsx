import { assignmentStateStates, countOf } from "@tagloom/contracts";
import { Link } from "react-router";
import { Skeleton } from "@/components/ui/card";
import { DueDate } from "@/components/ui/due-date";
import { StateBadge } from "@/components/ui/state-badge";
import { paths } from "@/config/paths";
import { useQueue } from "@/features/queue/api/get-queue";
import { OverviewSection } from "./section";

/** The signed-in member's open work with due dates, the next one first. */
export function MyWorkSection({ orgId, onlyWhenAssigned = false }: { orgId: string; onlyWhenAssigned?: boolean }) {
  const queue = useQueue(orgId);
  const items = queue.data?.items ?? [];
  // Managers, data leads and admins may annotate too; their overview shows this only when they have work.
  if (onlyWhenAssigned && items.length === 0) return null;
  return (
    <OverviewSection title="My open work" link={{ to: paths.org.queue.build(orgId), text: "My queue" }}>
      {queue.isPending ? (
        <Skeleton rows={3} />
      ) : queue.isError ? (
        <p className="text-sm text-rust-500">{queue.error.message}</p>
      ) : items.length === 0 ? (
        <p className="text-sm text-ink-500">Nothing assigned to you right now.{queue.data.done.length ? ` ${countOf(queue.data.done.length, "document")} done so far.` : ""}</p>
      ) : (
        <>
          <p className="text-sm text-ink-700">{countOf(items.length, "document")} to annotate.</p>
          <ul className="divide-y divide-ink-50 text-sm">
            {items.slice(0, 5).map((i) => (
              <li key={i.assignmentId} className="flex flex-wrap items-center justify-between gap-x-3 gap-y-1 py-2">
                <Link to={paths.org.assignment.build(orgId, i.corpusId, i.assignmentId)} className="min-w-0 truncate font-medium text-ink-800 hover:underline">
                  {i.documentTitle || "Untitled"}
                </Link>
                <span className="flex items-center gap-2">
                  <DueDate day={i.dueDate} />
                  <StateBadge state={assignmentStateStates[i.state]} />
                </span>
              </li>
            ))}
          </ul>
        </>
      )}
    </OverviewSection>
  );
}
