import { can } from "@tagloom/contracts";
import { useState } from "react";
import { useNavigate } from "react-router";
import { Button } from "@/components/ui/button";
import { Card, EmptyState, Notice, PageHeader, Skeleton } from "@/components/ui/card";
import { Select } from "@/components/ui/field";
import { paths } from "@/config/paths";
import { type CorporaFilter, useCorpora } from "@/features/corpora/api/get-corpora";
import { CorporaTable } from "@/features/corpora/components/corpora-table";
import { CreateCorpusForm } from "@/features/corpora/components/create-corpus-form";
import { useCurrentOrg } from "@/features/orgs/hooks/use-current-org";

/** The organization's corpora; managers create new ones here. */
export function CorporaRoute() {
  const org = useCurrentOrg();
  const navigate = useNavigate();
  const canManage = can(org.role, "manageCorpora");
  const [archived, setArchived] = useState<CorporaFilter>("false");
  const corpora = useCorpora(org.organizationId, archived);
  const items = corpora.data?.pages.flatMap((p) => p.items) ?? [];
  const linkTo = (corpusId: string) => paths.org.corpus.build(org.organizationId, corpusId);
  return (
    <div className="max-w-5xl space-y-6">
      <PageHeader
        title="Corpora"
        subtitle="Bodies of documents, each with its own entity schema."
        actions={
          <Select aria-label="Which corpora" className="w-44" value={archived} onChange={(e) => setArchived(e.target.value as CorporaFilter)}>
            <option value="false">Active</option>
            <option value="true">Archived</option>
            <option value="all">All</option>
          </Select>
        }
      />
      {canManage ? (
        <Card>
          <h2 className="mb-3 font-semibold text-ink-900">New corpus</h2>
          <CreateCorpusForm orgId={org.organizationId} onCreated={(id) => navigate(paths.org.corpusSchema.build(org.organizationId, id))} />
        </Card>
      ) : null}
      {corpora.isPending ? (
        <Skeleton shape="table" />
      ) : corpora.isError ? (
        <Notice tone="error">{corpora.error.message}</Notice>
      ) : items.length === 0 ? (
        <EmptyState title={archived === "true" ? "No archived corpora" : "No corpora yet"}>
          {canManage ? "Create one above, define its entity types, then upload documents." : "A manager creates corpora and uploads documents."}
        </EmptyState>
      ) : (
        <CorporaTable corpora={items} linkTo={linkTo} />
      )}
      {corpora.hasNextPage ? (
        <Button variant="secondary" busy={corpora.isFetchingNextPage} onClick={() => void corpora.fetchNextPage()}>
          Show more corpora
        </Button>
      ) : null}
    </div>
  );
}
