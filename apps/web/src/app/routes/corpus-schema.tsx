import { can } from "@tagloom/contracts";
import { useParams } from "react-router";
import { Notice } from "@/components/ui/card";
import { useCorpus } from "@/features/corpora/api/get-corpus";
import { EntitySchemaEditor } from "@/features/corpora/components/entity-schema-editor";
import { useCurrentOrg } from "@/features/orgs/hooks/use-current-org";

/** The corpus's entity schema; managers edit it unless the corpus is archived. */
export function CorpusSchemaRoute() {
  const org = useCurrentOrg();
  const { corpusId = "" } = useParams();
  const corpus = useCorpus(org.organizationId, corpusId);
  const archived = !!corpus.data?.archivedAt;
  return (
    <div className="max-w-4xl space-y-4">
      {archived ? <Notice tone="info">This corpus is archived: unarchive it in Settings to change its schema.</Notice> : null}
      <EntitySchemaEditor orgId={org.organizationId} corpusId={corpusId} canManage={can(org.role, "manageCorpora") && !archived} />
    </div>
  );
}
