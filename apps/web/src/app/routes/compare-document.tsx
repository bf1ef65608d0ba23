import { Link, useParams } from "react-router";
import { Notice, Skeleton } from "@/components/ui/card";
import { paths } from "@/config/paths";
import { useCurrentOrg } from "@/features/orgs/hooks/use-current-org";
import { useComparison, useComparisonDocument } from "@/features/training/api/get-comparison";
import { ComparisonDocumentView } from "@/features/training/components/comparison-document";

/** A test document read as gold, tagger A and tagger B (read-only). */
export function CompareDocumentRoute() {
  const org = useCurrentOrg();
  const { corpusId = "", taggerId = "", otherId = "", documentId = "" } = useParams();
  const orgId = org.organizationId;
  const doc = useComparisonDocument(orgId, corpusId, taggerId, otherId, documentId);
  const comparison = useComparison(orgId, corpusId, taggerId, otherId);
  return (
    <div className="space-y-4">
      <p className="text-sm">
        <Link className="text-ink-500 hover:underline" to={paths.org.compare.build(orgId, corpusId, taggerId, otherId)}>
          ← Comparison
        </Link>
      </p>
      {doc.isPending ? (
        <Skeleton />
      ) : doc.isError ? (
        <Notice tone="error">{doc.error.message}</Notice>
      ) : (
        <ComparisonDocumentView doc={doc.data} labelA={comparison.data?.a.label ?? "tagger A"} labelB={comparison.data?.b.label ?? "tagger B"} />
      )}
    </div>
  );
}
