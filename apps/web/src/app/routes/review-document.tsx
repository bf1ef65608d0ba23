import { countOf } from "@tagloom/contracts";
import { Link, useNavigate, useParams } from "react-router";
import { Notice, PageHeader, Skeleton } from "@/components/ui/card";
import { useToast } from "@/components/ui/toaster";
import { paths } from "@/config/paths";
import { useCurrentOrg } from "@/features/orgs/hooks/use-current-org";
import { useReviewDocument } from "@/features/review/api/get-review-document";
import { ReviewPanel } from "@/features/review/components/review-panel";
import { RequireAbility } from "@/components/layout/not-allowed";
import { UserText } from "@/components/ui/user-text";

/** Review of one document of a batch. */
export function ReviewDocumentRoute() {
  return (
    <RequireAbility ability="review" what="Review is for managers.">
      <ReviewDocumentScreen />
    </RequireAbility>
  );
}

function ReviewDocumentScreen() {
  const org = useCurrentOrg();
  const id = org.organizationId;
  const { corpusId = "", batchId = "", documentId = "" } = useParams();
  const review = useReviewDocument(id, corpusId, batchId, documentId);
  const navigate = useNavigate();
  const toast = useToast();
  if (review.isPending) return <Skeleton />;
  if (review.isError) return <Notice tone="error">{review.error.message}</Notice>;
  const v = review.data;
  return (
    <div className="max-w-5xl space-y-4">
      <Link to={paths.org.batch.build(id, corpusId, batchId)} className="text-xs text-ink-500 hover:underline">
        ← Batch <UserText>{v.batch.name}</UserText>
      </Link>
      <PageHeader title={`Review: ${v.document.title}`} subtitle={v.gold ? `This document already has gold (${countOf(v.gold.length, "span")}); accepting replaces it.` : undefined} />
      <ReviewPanel
        key={v.assignments.map((a) => `${a.id}:${a.state}`).join(",")}
        orgId={id}
        view={v}
        openLink={(assignmentId) => `${paths.org.assignment.build(id, corpusId, assignmentId)}?from=review`}
        onDone={(what) => {
          toast.show(what, "success");
          navigate(paths.org.batch.build(id, corpusId, batchId));
        }}
      />
    </div>
  );
}
