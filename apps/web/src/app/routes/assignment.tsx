import { useEffect } from "react";
import { Link, useParams } from "react-router";
import { Notice } from "@/components/ui/card";
import { paths } from "@/config/paths";
import { useCurrentOrg } from "@/features/orgs/hooks/use-current-org";
import { useQueue } from "@/features/queue/api/get-queue";
import { useAssignment } from "@/features/workspace/api/get-assignment";
import { Workspace } from "@/features/workspace/components/workspace";
import { WorkspaceSkeleton } from "@/features/workspace/components/workspace-skeleton";

/** The annotation workspace for one assignment. */
export function AssignmentRoute() {
  const org = useCurrentOrg();
  const { corpusId = "", assignmentId = "" } = useParams();
  const assignment = useAssignment(org.organizationId, corpusId, assignmentId);
  useEffect(() => {
    if (assignment.isSuccess) performance.mark("tagloom:assignment-loaded");
  }, [assignment.isSuccess]);
  if (assignment.isPending) return <WorkspaceSkeleton />;
  if (assignment.isError) return <Notice tone="error">{assignment.error.message}</Notice>;
  return (
    <Workspace
      key={assignment.data.id}
      orgId={org.organizationId}
      view={assignment.data}
      backLink={
        // Someone else's work, opened read-only from Review, goes back to that review.
        assignment.data.annotator.userId !== org.userId ? (
          <Link to={paths.org.reviewDocument.build(org.organizationId, corpusId, assignment.data.batch.id, assignment.data.document.id)} className="hover:underline">
            ← Review
          </Link>
        ) : (
          <Link to={paths.org.queue.build(org.organizationId)} className="hover:underline">
            ← My queue
          </Link>
        )
      }
      afterSubmit={<NextLink orgId={org.organizationId} currentId={assignment.data.id} />}
    />
  );
}

function NextLink({ orgId, currentId }: { orgId: string; currentId: string }) {
  const queue = useQueue(orgId);
  const next = queue.data?.items.find((i) => i.assignmentId !== currentId);
  if (!next) return <Link to={paths.org.queue.build(orgId)} className="font-medium underline">Back to my queue</Link>;
  return (
    <Link to={paths.org.assignment.build(orgId, next.corpusId, next.assignmentId)} className="font-medium underline">
      Next document: {next.documentTitle || "Untitled"}
    </Link>
  );
}
