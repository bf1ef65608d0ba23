import { type CorpusSummary, annotationStatuses, annotationStatusStates, batchStateOf, batchStateStates } from "@tagloom/contracts";
import { useQueries } from "@tanstack/react-query";
import { Link } from "react-router";
import { Skeleton } from "@/components/ui/card";
import { DueDate } from "@/components/ui/due-date";
import { StateBadge } from "@/components/ui/state-badge";
import { paths } from "@/config/paths";
import { useBatches } from "@/features/batches/api/get-batches";
import { corpusQueryOptions } from "@/features/corpora/api/get-corpus";
import { OverviewSection, ProgressLine } from "./section";

/** Batches under way with their progress (accepted assignments of all), newest first. */
export function BatchProgressSection({ orgId }: { orgId: string }) {
  const batches = useBatches(orgId);
  const all = batches.data?.pages.flatMap((p) => p.items) ?? [];
  const shown = all.filter((b) => batchStateOf(b.assignments) !== "done").slice(0, 5);
  return (
    <OverviewSection title="Batch progress" link={{ to: paths.org.batches.build(orgId), text: "All batches" }}>
      {batches.isPending ? (
        <Skeleton rows={3} />
      ) : batches.isError ? (
        <p className="text-sm text-rust-500">{batches.error.message}</p>
      ) : shown.length === 0 ? (
        <p className="text-sm text-ink-500">{all.length ? "Every batch is done." : "No batches yet."}</p>
      ) : (
        <ul className="space-y-3 text-sm">
          {shown.map((b) => (
            <li key={b.id} className="space-y-1">
              <div className="flex flex-wrap items-center justify-between gap-x-3 gap-y-1">
                <Link to={paths.org.batch.build(orgId, b.corpusId, b.id)} className="min-w-0 truncate font-medium text-ink-800 hover:underline">
                  {b.name}
                </Link>
                <span className="flex items-center gap-2">
                  <DueDate day={b.dueDate} />
                  <StateBadge state={batchStateStates[batchStateOf(b.assignments)]} />
                </span>
              </div>
              <ProgressLine done={b.assignments.accepted} total={b.assignments.total} label={`${b.name}: assignments accepted`} />
            </li>
          ))}
        </ul>
      )}
    </OverviewSection>
  );
}

/** Documents of each corpus (the first few) by annotation status. */
export function DocumentsByStatusSection({ orgId, corpora }: { orgId: string; corpora: CorpusSummary[] }) {
  const details = useQueries({ queries: corpora.map((c) => corpusQueryOptions(orgId, c.id)) });
  return (
    <OverviewSection title="Documents by status" link={{ to: paths.org.corpora.build(orgId), text: "Corpora" }}>
      {corpora.length === 0 ? <p className="text-sm text-ink-500">No corpora yet.</p> : null}
      <ul className="space-y-3 text-sm">
        {corpora.map((c, i) => {
          const d = details[i]?.data;
          return (
            <li key={c.id} className="space-y-1">
              <Link to={paths.org.corpus.build(orgId, c.id)} className="font-medium text-ink-800 hover:underline">
                {c.name}
              </Link>
              {d ? (
                <dl className="flex flex-wrap gap-x-4 gap-y-1">
                  {annotationStatuses.map((s) => (
                    <div key={s} className="flex items-center gap-1.5">
                      <dt>
                        <StateBadge state={annotationStatusStates[s]} />
                      </dt>
                      <dd className="tabular-nums text-ink-700">{d.statuses[s]}</dd>
                    </div>
                  ))}
                </dl>
              ) : (
                <Skeleton rows={1} />
              )}
            </li>
          );
        })}
      </ul>
    </OverviewSection>
  );
}
