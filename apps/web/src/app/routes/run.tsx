import { can } from "@tagloom/contracts";
import { Link, useParams } from "react-router";
import { Notice, Skeleton } from "@/components/ui/card";
import { paths } from "@/config/paths";
import { useCurrentOrg } from "@/features/orgs/hooks/use-current-org";
import { useRun } from "@/features/training/api/get-run";
import { RunView } from "@/features/training/components/run-view";

/** One training run, refreshed every second until it ends. */
export function RunRoute() {
  const org = useCurrentOrg();
  const { corpusId = "", runId = "" } = useParams();
  const orgId = org.organizationId;
  const run = useRun(orgId, corpusId, runId);
  return (
    <div className="space-y-4">
      <p className="text-sm">
        <Link className="text-ink-500 hover:underline" to={paths.org.corpusTraining.build(orgId, corpusId)}>
          ← Training
        </Link>
      </p>
      {run.isPending ? <Skeleton /> : run.isError ? <Notice tone="error">{run.error.message}</Notice> : <RunView orgId={orgId} corpusId={corpusId} run={run.data} canTrain={can(org.role, "train")} />}
    </div>
  );
}
