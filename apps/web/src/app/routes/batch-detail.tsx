import { countOf } from "@tagloom/contracts";
import { Link, useParams } from "react-router";
import { Card, Notice, PageHeader, Skeleton } from "@/components/ui/card";
import { DueDate } from "@/components/ui/due-date";
import { paths } from "@/config/paths";
import { useBatch } from "@/features/batches/api/get-batch";
import { useBatchAgreement } from "@/features/batches/api/get-batch-agreement";
import { AgreementView } from "@/features/batches/components/agreement-view";
import { AnnotatorProgress, BatchDocuments } from "@/features/batches/components/batch-progress";
import { ProgressBar } from "@/features/batches/components/progress-bar";
import { useCurrentOrg } from "@/features/orgs/hooks/use-current-org";
import { RequireAbility } from "@/components/layout/not-allowed";

/** A batch: overall progress, progress per annotator, agreement, and its documents to review. */
export function BatchDetailRoute() {
  return (
    <RequireAbility ability="manageBatches" what="A batch's progress is for managers.">
      <BatchDetailScreen />
    </RequireAbility>
  );
}

function BatchDetailScreen() {
  const org = useCurrentOrg();
  const id = org.organizationId;
  const { corpusId = "", batchId = "" } = useParams();
  const batch = useBatch(id, corpusId, batchId);
  const agreement = useBatchAgreement(id, corpusId, batchId);
  if (batch.isPending) return <Skeleton shape="table" rows={6} />;
  if (batch.isError) return <Notice tone="error">{batch.error.message}</Notice>;
  const b = batch.data;
  return (
    <div className="max-w-6xl space-y-8">
      <div>
        <Link to={paths.org.batches.build(id)} className="text-xs text-ink-500 hover:underline">
          ← Batches
        </Link>
        <PageHeader
          title={b.name}
          subtitle={
            <>
              {countOf(b.documentCount, "document")} · {countOf(b.annotatorsPerDocument, "annotator")} per document · <DueDate day={b.dueDate} />
              {b.createdBy ? ` · made by ${b.createdBy}` : ""}
            </>
          }
        />
      </div>
      <Card className="flex flex-wrap items-center gap-8">
        <div>
          <p className="text-xs font-semibold tracking-wide text-ink-500 uppercase">Assignments</p>
          <ProgressBar counts={b.assignments} label="All assignments" />
        </div>
        <div>
          <p className="text-xs font-semibold tracking-wide text-ink-500 uppercase">Documents settled</p>
          <p className="text-2xl font-semibold tabular-nums">
            {b.documentsSettled} <span className="text-sm font-normal text-ink-500">of {b.documentCount}</span>
          </p>
        </div>
      </Card>
      <section className="space-y-3">
        <h2 className="text-lg font-semibold">Progress per annotator</h2>
        <AnnotatorProgress batch={b} />
      </section>
      <section className="space-y-3">
        <h2 className="text-lg font-semibold">Agreement</h2>
        {agreement.isPending ? <Skeleton /> : agreement.isError ? <Notice tone="error">{agreement.error.message}</Notice> : <AgreementView agreement={agreement.data} />}
      </section>
      <section className="space-y-3">
        <h2 className="text-lg font-semibold">Documents</h2>
        <BatchDocuments batch={b} reviewLink={(documentId) => paths.org.reviewDocument.build(id, corpusId, b.id, documentId)} />
      </section>
    </div>
  );
}
