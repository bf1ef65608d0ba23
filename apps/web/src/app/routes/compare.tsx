import { Link, useParams } from "react-router";
import { Notice, Skeleton } from "@/components/ui/card";
import { paths } from "@/config/paths";
import { useCurrentOrg } from "@/features/orgs/hooks/use-current-org";
import { useComparison } from "@/features/training/api/get-comparison";
import { ComparisonView } from "@/features/training/components/comparison-view";

/** Two taggers of the corpus side by side on the same test documents. */
export function CompareRoute() {
  const org = useCurrentOrg();
  const { corpusId = "", taggerId = "", otherId = "" } = useParams();
  const orgId = org.organizationId;
  const comparison = useComparison(orgId, corpusId, taggerId, otherId);
  return (
    <div className="space-y-4">
      <p className="text-sm">
        <Link className="text-ink-500 hover:underline" to={paths.org.tagger.build(orgId, corpusId, taggerId)}>
          ← Tagger A
        </Link>
      </p>
      {comparison.isPending ? (
        <Skeleton />
      ) : comparison.isError ? (
        <Notice tone="error">{comparison.error.message}</Notice>
      ) : (
        <ComparisonView orgId={orgId} corpusId={corpusId} comparison={comparison.data} />
      )}
    </div>
  );
}
