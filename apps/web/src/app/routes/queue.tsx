import { Link } from "react-router";
import { EmptyState, Notice, PageHeader, Skeleton } from "@/components/ui/card";
import { paths } from "@/config/paths";
import { useCurrentOrg } from "@/features/orgs/hooks/use-current-org";
import { useQueue } from "@/features/queue/api/get-queue";
import { QueueTable } from "@/features/queue/components/queue-table";

/** The annotator's queue: open, started and sent-back assignments, the next one first. */
export function QueueRoute() {
  const org = useCurrentOrg();
  const queue = useQueue(org.organizationId);
  const link = (i: { corpusId: string; assignmentId: string }) => paths.org.assignment.build(org.organizationId, i.corpusId, i.assignmentId);
  return (
    <div className="max-w-6xl space-y-6">
      <PageHeader
        title="My queue"
        subtitle="Documents given to you to annotate. Work sent back for changes comes first, then by due date."
        actions={
          queue.data?.next ? (
            <Link to={link(queue.data.next)} className="inline-flex h-10 items-center rounded-md bg-ink-700 px-4 text-sm font-medium text-white hover:bg-ink-800">
              Start next: {queue.data.next.documentTitle || "Untitled"}
            </Link>
          ) : null
        }
      />
      {queue.isPending ? (
        <Skeleton shape="table" />
      ) : queue.isError ? (
        <Notice tone="error">{queue.error.message}</Notice>
      ) : queue.data.items.length ? (
        <QueueTable items={queue.data.items} linkTo={link} />
      ) : (
        <EmptyState title="Nothing to annotate">When a manager gives you documents in a batch, they appear here and you get an e-mail.</EmptyState>
      )}
    </div>
  );
}
