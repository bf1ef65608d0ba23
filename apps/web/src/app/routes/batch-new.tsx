import { useNavigate, useSearchParams } from "react-router";
import { Notice, PageHeader, Skeleton } from "@/components/ui/card";
import { useToast } from "@/components/ui/toaster";
import { paths } from "@/config/paths";
import { useBatchCorpora } from "@/features/batches/api/get-batch-corpora";
import { BatchForm } from "@/features/batches/components/batch-form";
import { useMembers } from "@/features/members/api/members";
import { useCurrentOrg } from "@/features/orgs/hooks/use-current-org";
import { RequireAbility } from "@/components/layout/not-allowed";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** A new batch; `?corpus=&documents=a,b` carries a selection from the Documents table. */
export function BatchNewRoute() {
  return (
    <RequireAbility ability="manageBatches" what="Making batches is for managers.">
      <BatchNewScreen />
    </RequireAbility>
  );
}

function BatchNewScreen() {
  const org = useCurrentOrg();
  const id = org.organizationId;
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const toast = useToast();
  const corpora = useBatchCorpora(id);
  const members = useMembers(id);
  const corpusParam = params.get("corpus");
  const documentIds = (params.get("documents") ?? "").split(",").filter((x) => UUID.test(x));
  const allMembers = members.data?.pages.flatMap((p) => p.items) ?? [];
  return (
    <div className="max-w-5xl">
      <PageHeader title="New batch" subtitle="Give documents to annotators. k ≥ 2 annotators per document lets you measure agreement and settle conflicts." />
      {corpora.isPending || members.isPending ? (
        <Skeleton />
      ) : corpora.isError ? (
        <Notice tone="error">{corpora.error.message}</Notice>
      ) : members.isError ? (
        <Notice tone="error">{members.error.message}</Notice>
      ) : (
        <BatchForm
          orgId={id}
          corpora={corpora.data.items}
          members={allMembers}
          initialCorpusId={corpusParam && UUID.test(corpusParam) ? corpusParam : null}
          initialDocumentIds={documentIds}
          onCreated={(batch) => {
            toast.show(`Batch "${batch.name}" created; the annotators have been e-mailed.`, "success");
            navigate(paths.org.batch.build(id, batch.corpusId, batch.id));
          }}
        />
      )}
    </div>
  );
}
