import { can } from "@tagloom/contracts";
import { useParams } from "react-router";
import { Notice } from "@/components/ui/card";
import { useCorpus } from "@/features/corpora/api/get-corpus";
import { useCurrentOrg } from "@/features/orgs/hooks/use-current-org";
import { FilesTable } from "@/features/uploads/components/files-table";
import { UploadPanel } from "@/features/uploads/components/upload-panel";
import { RequireAbility } from "@/components/layout/not-allowed";

/** Upload files (managers) and follow every file of the corpus to ready or refused. */
export function CorpusUploadsRoute() {
  return (
    <RequireAbility ability="viewCorpusData" what="Uploads are for managers and data leads.">
      <CorpusUploadsScreen />
    </RequireAbility>
  );
}

function CorpusUploadsScreen() {
  const org = useCurrentOrg();
  const { corpusId = "" } = useParams();
  const corpus = useCorpus(org.organizationId, corpusId);
  const canManage = can(org.role, "manageCorpora");
  const disabledReason = corpus.data?.archivedAt ? "This corpus is archived: unarchive it in Settings to upload." : null;
  return (
    <div className="space-y-8">
      {canManage && corpus.data?.entityTypeCount === 0 ? (
        <Notice tone="info">This corpus has no entity types yet. Plain documents upload fine; spans in JSONL or column files need their types in the schema first.</Notice>
      ) : null}
      {canManage ? <UploadPanel orgId={org.organizationId} corpusId={corpusId} disabledReason={disabledReason} /> : null}
      <div className="space-y-3">
        <h2 className="font-semibold text-ink-900">Files</h2>
        <FilesTable orgId={org.organizationId} corpusId={corpusId} />
      </div>
    </div>
  );
}
