import { can } from "@tagloom/contracts";
import { useNavigate, useParams } from "react-router";
import { Notice, Skeleton } from "@/components/ui/card";
import { useToast } from "@/components/ui/toaster";
import { paths } from "@/config/paths";
import { useCorpus } from "@/features/corpora/api/get-corpus";
import { CorpusSettings } from "@/features/corpora/components/corpus-settings";
import { useCurrentOrg } from "@/features/orgs/hooks/use-current-org";

/** Rename, archive or delete the corpus (managers and admins). */
export function CorpusSettingsRoute() {
  const org = useCurrentOrg();
  const { corpusId = "" } = useParams();
  const corpus = useCorpus(org.organizationId, corpusId);
  const navigate = useNavigate();
  const toast = useToast();
  if (!can(org.role, "manageCorpora")) return <Notice tone="info">Only managers and admins change a corpus's settings.</Notice>;
  if (corpus.isPending) return <Skeleton />;
  if (corpus.isError) return <Notice tone="error">{corpus.error.message}</Notice>;
  return (
    <CorpusSettings
      orgId={org.organizationId}
      corpus={corpus.data}
      documentCount={corpus.data.documentCount}
      onDeleted={() => {
        toast.show(`${corpus.data.name} deleted.`, "success");
        navigate(paths.org.corpora.build(org.organizationId), { replace: true });
      }}
    />
  );
}
