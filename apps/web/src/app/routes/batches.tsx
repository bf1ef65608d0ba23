import { Link } from "react-router";
import { Button } from "@/components/ui/button";
import { EmptyState, Notice, PageHeader, Skeleton } from "@/components/ui/card";
import { paths } from "@/config/paths";
import { useBatchCorpora } from "@/features/batches/api/get-batch-corpora";
import { useBatches } from "@/features/batches/api/get-batches";
import { BatchesTable } from "@/features/batches/components/batches-table";
import { useCurrentOrg } from "@/features/orgs/hooks/use-current-org";
import { RequireAbility } from "@/components/layout/not-allowed";

/** Every batch of the organization, newest first. */
export function BatchesRoute() {
  return (
    <RequireAbility ability="manageBatches" what="Batches are for managers.">
      <BatchesScreen />
    </RequireAbility>
  );
}

function BatchesScreen() {
  const org = useCurrentOrg();
  const id = org.organizationId;
  const batches = useBatches(id);
  const corpora = useBatchCorpora(id);
  const names = new Map((corpora.data?.items ?? []).map((c) => [c.id, c.name]));
  const all = batches.data?.pages.flatMap((p) => p.items) ?? [];
  return (
    <div className="max-w-6xl space-y-6">
      <PageHeader
        title="Batches"
        subtitle="Documents given to annotators with a due date. Open a batch for progress, review and agreement."
        actions={
          <Link to={paths.org.newBatch.build(id)} className="inline-flex h-10 items-center rounded-md bg-ink-700 px-4 text-sm font-medium text-white hover:bg-ink-800">
            New batch
          </Link>
        }
      />
      {batches.isPending ? (
        <Skeleton shape="table" />
      ) : batches.isError ? (
        <Notice tone="error">{batches.error.message}</Notice>
      ) : all.length ? (
        <>
          <BatchesTable batches={all} corpusName={(c) => names.get(c) ?? "—"} linkTo={(b) => paths.org.batch.build(id, b.corpusId, b.id)} />
          {batches.hasNextPage ? (
            <Button variant="secondary" busy={batches.isFetchingNextPage} onClick={() => void batches.fetchNextPage()}>
              Show more batches
            </Button>
          ) : null}
        </>
      ) : (
        <EmptyState title="No batches yet">Make one from documents of a corpus: pick them here or in a corpus's Documents table.</EmptyState>
      )}
    </div>
  );
}
