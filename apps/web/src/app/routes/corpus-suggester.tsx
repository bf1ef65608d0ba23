import { can } from "@tagloom/contracts";
import { useParams } from "react-router";
import { Notice, Skeleton } from "@/components/ui/card";
import { useCurrentOrg } from "@/features/orgs/hooks/use-current-org";
import { useSuggester } from "@/features/suggestions/api/get-suggester";
import { SuggesterPanel } from "@/features/suggestions/components/suggester-panel";

/** The corpus's suggester: which tagger pre-annotates, its progress and precision; data leads pick it. */
export function CorpusSuggesterRoute() {
  const org = useCurrentOrg();
  const { corpusId = "" } = useParams();
  const status = useSuggester(org.organizationId, corpusId);
  if (status.isPending) return <Skeleton />;
  if (status.isError) return <Notice tone="error">{status.error.message}</Notice>;
  return (
    <div className="max-w-3xl">
      <SuggesterPanel
        key={status.data.tagger?.id ?? "none"}
        orgId={org.organizationId}
        corpusId={corpusId}
        status={status.data}
        canChoose={can(org.role, "train")}
      />
    </div>
  );
}
