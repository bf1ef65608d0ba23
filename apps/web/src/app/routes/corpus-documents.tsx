import { can } from "@tagloom/contracts";
import { useState } from "react";
import { Link, Navigate, useParams } from "react-router";
import { Notice } from "@/components/ui/card";
import { paths } from "@/config/paths";
import { useCorpus } from "@/features/corpora/api/get-corpus";
import { DocumentsTable } from "@/features/documents/components/documents-table";
import { RandomSplitDialog } from "@/features/documents/components/random-split-dialog";
import { useCurrentOrg } from "@/features/orgs/hooks/use-current-org";
import { formatCount } from "@/lib/format";
import { RequireAbility } from "@/components/layout/not-allowed";

/** The corpus's Documents table, refreshing while uploaded files are still being processed. */
export function CorpusDocumentsRoute() {
  const org = useCurrentOrg();
  const { corpusId = "" } = useParams();
  // An annotator opening a corpus lands on its guidelines.
  if (org.role === "annotator") return <Navigate to={paths.org.corpusSchema.build(org.organizationId, corpusId)} replace />;
  return (
    <RequireAbility ability="viewCorpusData" what="A corpus's documents and their gold spans are for managers and data leads; annotators see the documents of their own assignments.">
      <CorpusDocumentsScreen />
    </RequireAbility>
  );
}

function CorpusDocumentsScreen() {
  const org = useCurrentOrg();
  const { corpusId = "" } = useParams();
  const corpus = useCorpus(org.organizationId, corpusId);
  const [splitOpen, setSplitOpen] = useState(false);
  const canManage = can(org.role, "manageCorpora") && !corpus.data?.archivedAt;
  const pending = corpus.data?.pendingFiles ?? 0;
  return (
    <div className="space-y-4">
      {pending > 0 ? (
        <Notice tone="info">
          {formatCount(pending)} file{pending === 1 ? " is" : "s are"} still being processed; documents appear here as they become ready.{" "}
          <Link className="underline" to={paths.org.corpusUploads.build(org.organizationId, corpusId)}>
            See the files
          </Link>
        </Notice>
      ) : null}
      <DocumentsTable
        orgId={org.organizationId}
        corpusId={corpusId}
        canManage={canManage}
        refetchMs={pending > 0 ? 1500 : false}
        linkTo={(documentId) => paths.org.document.build(org.organizationId, corpusId, documentId)}
        onRandomSplit={canManage ? () => setSplitOpen(true) : undefined}
        selectionActions={
          can(org.role, "manageBatches")
            ? (documentIds) => (
                <Link
                  className="inline-flex h-8 items-center rounded-md bg-ink-700 px-3 text-sm font-medium text-white hover:bg-ink-800"
                  to={paths.org.newBatch.build(org.organizationId, { corpusId, documentIds })}
                >
                  Make a batch…
                </Link>
              )
            : undefined
        }
      />
      {corpus.data ? (
        <RandomSplitDialog
          orgId={org.organizationId}
          corpusId={corpusId}
          open={splitOpen}
          onClose={() => setSplitOpen(false)}
          counts={{ all: corpus.data.documentCount, unassigned: corpus.data.splits.none }}
        />
      ) : null}
    </div>
  );
}
