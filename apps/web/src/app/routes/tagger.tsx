import { can } from "@tagloom/contracts";
import { Link, useParams } from "react-router";
import { Notice, Skeleton } from "@/components/ui/card";
import { paths } from "@/config/paths";
import { useCurrentOrg } from "@/features/orgs/hooks/use-current-org";
import { useRun } from "@/features/training/api/get-run";
import { useTagger } from "@/features/training/api/get-tagger";
import { useTaggers } from "@/features/training/api/get-taggers";
import { TaggerView } from "@/features/training/components/tagger-view";

/** A tagger's page: its scores, charts, settings, downloads and the way to compare it. */
export function TaggerRoute() {
  const org = useCurrentOrg();
  const { corpusId = "", taggerId = "" } = useParams();
  const orgId = org.organizationId;
  const tagger = useTagger(orgId, corpusId, taggerId);
  const all = useTaggers(orgId, corpusId);
  const runId = tagger.data?.runId ?? "";
  const run = useRun(orgId, corpusId, runId);
  return (
    <div className="space-y-4">
      <p className="text-sm">
        <Link className="text-ink-500 hover:underline" to={paths.org.corpusTraining.build(orgId, corpusId)}>
          ← Training
        </Link>
      </p>
      {tagger.isPending ? (
        <Skeleton />
      ) : tagger.isError ? (
        <Notice tone="error">{tagger.error.message}</Notice>
      ) : (
        <TaggerView
          orgId={orgId}
          corpusId={corpusId}
          tagger={tagger.data}
          run={runId && run.data ? run.data : null}
          others={(all.data?.items ?? []).filter((t) => t.id !== taggerId)}
          canDownload={can(org.role, "downloadTaggers")}
        />
      )}
    </div>
  );
}
