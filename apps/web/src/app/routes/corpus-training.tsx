import { can } from "@tagloom/contracts";
import { Link, useParams } from "react-router";
import { Card, EmptyState, Notice, Skeleton } from "@/components/ui/card";
import { paths } from "@/config/paths";
import { useCurrentOrg } from "@/features/orgs/hooks/use-current-org";
import { useSuggester } from "@/features/suggestions/api/get-suggester";
import { RUN_LIST_LIMIT, useRuns } from "@/features/training/api/get-runs";
import { useTaggers } from "@/features/training/api/get-taggers";
import { RunsTable } from "@/features/training/components/runs-table";
import { TaggersTable } from "@/features/training/components/taggers-table";

/** A corpus's training: its taggers, its runs (live while one trains) and the way to start one. */
export function CorpusTrainingRoute() {
  const org = useCurrentOrg();
  const { corpusId = "" } = useParams();
  const orgId = org.organizationId;
  const runs = useRuns(orgId, corpusId);
  const taggers = useTaggers(orgId, corpusId);
  const suggester = useSuggester(orgId, corpusId);
  const canTrain = can(org.role, "train");
  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <p className="max-w-2xl text-sm text-ink-600">
          A run trains a tagger on the corpus's gold documents and scores it on the test split. Taggers never change once made; compare two to choose the suggester.
        </p>
        {canTrain ? (
          <Link className="rounded-md bg-ink-900 px-4 py-2 text-sm font-medium text-white hover:bg-ink-800" to={paths.org.newRun.build(orgId, corpusId)}>
            New training run
          </Link>
        ) : null}
      </div>
      <section className="space-y-2">
        <h2 className="font-semibold text-ink-900">Taggers</h2>
        {taggers.isPending ? (
          <Skeleton shape="table" rows={2} />
        ) : taggers.isError ? (
          <Notice tone="error">{taggers.error.message}</Notice>
        ) : taggers.data.items.length === 0 ? (
          <EmptyState title="No taggers yet">A finished run stores one here.</EmptyState>
        ) : (
          <TaggersTable orgId={orgId} corpusId={corpusId} taggers={taggers.data.items} suggesterId={suggester.data?.tagger?.id ?? null} />
        )}
      </section>
      <section className="space-y-2">
        <h2 className="font-semibold text-ink-900">Runs</h2>
        {runs.isPending ? (
          <Skeleton shape="table" rows={3} />
        ) : runs.isError ? (
          <Notice tone="error">{runs.error.message}</Notice>
        ) : runs.data.items.length === 0 ? (
          <EmptyState title="No training runs yet">{canTrain ? "Start one with the engine's default settings, or change them first." : "A data lead starts them."}</EmptyState>
        ) : (
          <>
            <RunsTable orgId={orgId} corpusId={corpusId} runs={runs.data.items} />
            {runs.data.nextCursor ? <p className="text-xs text-ink-500">Showing the latest {RUN_LIST_LIMIT} runs.</p> : null}
          </>
        )}
      </section>
      {!canTrain ? (
        <Card className="text-sm text-ink-600">You can read runs and taggers; data leads and admins start runs and download taggers.</Card>
      ) : null}
    </div>
  );
}
