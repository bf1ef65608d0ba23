import { EmptyState, Notice, PageHeader, Skeleton } from "@/components/ui/card";
import { paths } from "@/config/paths";
import { useCurrentOrg } from "@/features/orgs/hooks/use-current-org";
import { useReviewList } from "@/features/review/api/get-review-list";
import { ReviewList } from "@/features/review/components/review-list";
import { RequireAbility } from "@/components/layout/not-allowed";

/** Documents with submitted work waiting for a reviewer. */
export function ReviewRoute() {
  return (
    <RequireAbility ability="review" what="Review is for managers.">
      <ReviewScreen />
    </RequireAbility>
  );
}

function ReviewScreen() {
  const org = useCurrentOrg();
  const id = org.organizationId;
  const list = useReviewList(id);
  return (
    <div className="max-w-6xl space-y-6">
      <PageHeader title="Review" subtitle="Submitted work to accept as gold, settle between annotators, or send back with a comment." />
      {list.isPending ? (
        <Skeleton shape="table" />
      ) : list.isError ? (
        <Notice tone="error">{list.error.message}</Notice>
      ) : list.data.items.length ? (
        <ReviewList
          items={list.data.items}
          linkTo={(i) => paths.org.reviewDocument.build(id, i.corpusId, i.batchId, i.documentId)}
        />
      ) : (
        <EmptyState title="Nothing to review">Submitted work appears here.</EmptyState>
      )}
    </div>
  );
}
