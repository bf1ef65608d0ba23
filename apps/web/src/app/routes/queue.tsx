import { Link } from "react-router";
import { DueDate } from "@/components/ui/due-date";
import { EmptyState, Notice, PageHeader, Skeleton } from "@/components/ui/card";
import { paths } from "@/config/paths";
import { useCurrentOrg } from "@/features/orgs/hooks/use-current-org";
import { useQueue } from "@/features/queue/api/get-queue";
import { QueueTable } from "@/features/queue/components/queue-table";

/** The annotator's queue: open, started and sent-back assignments, the next one first, then the finished ones. */
export function QueueRoute() {
  const org = useCurrentOrg();
  const queue = useQueue(org.organizationId);
  const link = (i: { corpusId: string; assignmentId: string }) => paths.org.assignment.build(org.organizationId, i.corpusId, i.assignmentId);
  const next = queue.data?.next ?? null;
  const done = queue.data?.done ?? [];
  return (
    <div className="max-w-6xl space-y-6">
      <PageHeader title="My queue" subtitle="Documents given to you to annotate. Work sent back for changes comes first, then by due date." />
      {next ? (
        // The button comes first and keeps its place whatever the document's title; the title follows it.
        <div className="flex flex-wrap items-center gap-x-4 gap-y-2 rounded-lg border border-ink-100 bg-white p-4">
          <Link
            to={link(next)}
            aria-label={`Start next: ${next.documentTitle || "Untitled"}`}
            className="inline-flex h-10 shrink-0 items-center rounded-md bg-ink-700 px-4 text-sm font-medium text-white hover:bg-ink-800"
          >
            Start next
          </Link>
          <div className="min-w-0 text-sm">
            <p className="truncate font-medium text-ink-900">{next.documentTitle || "Untitled"}</p>
            <p className="text-ink-500">
              {next.batchName} · {next.corpusName}
              {next.dueDate ? (
                <>
                  {" · "}
                  <DueDate day={next.dueDate} />
                </>
              ) : null}
            </p>
          </div>
        </div>
      ) : null}
      {queue.isPending ? (
        <Skeleton shape="table" />
      ) : queue.isError ? (
        <Notice tone="error">{queue.error.message}</Notice>
      ) : queue.data.items.length ? (
        <QueueTable items={queue.data.items} linkTo={link} />
      ) : (
        <EmptyState title="Nothing to annotate">When a manager gives you documents in a batch, they appear here and you get an e-mail.</EmptyState>
      )}
      {done.length ? (
        <section aria-labelledby="done-heading" className="space-y-3">
          <h2 id="done-heading" className="font-semibold text-ink-900">
            Done
          </h2>
          <p className="text-sm text-ink-500">Work you have submitted, the latest first. It opens read-only; a manager may accept it or send it back.</p>
          <QueueTable items={done} linkTo={link} finished caption="Done" />
        </section>
      ) : null}
    </div>
  );
}
