import { countOf } from "@tagloom/contracts";
import { useMemo } from "react";
import { Link } from "react-router";
import { EmptyState, Notice, PageHeader, Skeleton } from "@/components/ui/card";
import { paths } from "@/config/paths";
import { useCorpora } from "@/features/corpora/api/get-corpora";
import { useCurrentOrg } from "@/features/orgs/hooks/use-current-org";
import { useTaggers } from "@/features/training/api/get-taggers";
import { score } from "@/features/training/components/run-status";

function CorpusTaggers({ orgId, corpusId }: { orgId: string; corpusId: string }) {
  const taggers = useTaggers(orgId, corpusId);
  if (taggers.isPending) return <span className="text-xs text-ink-400">…</span>;
  if (taggers.isError) return <span className="text-xs text-rust-500">{taggers.error.message}</span>;
  const best = [...taggers.data.items].sort((a, b) => b.evaluation.overall.f1 - a.evaluation.overall.f1)[0];
  if (!best) return <span className="text-xs text-ink-500">No taggers yet</span>;
  return (
    <span className="text-xs text-ink-600">
      {taggers.data.items.length} {taggers.data.items.length === 1 ? "tagger" : "taggers"} · best{" "}
      <Link className="underline" to={paths.org.tagger.build(orgId, corpusId, best.id)}>
        {best.label}
      </Link>{" "}
      (F1 {score(best.evaluation.overall.f1)})
    </span>
  );
}

/** The Taggers area: every corpus with its taggers, each leading to the corpus's training page. */
export function TaggersRoute() {
  const org = useCurrentOrg();
  const orgId = org.organizationId;
  const corpora = useCorpora(orgId);
  const list = useMemo(() => corpora.data?.pages.flatMap((p) => p.items) ?? [], [corpora.data]);
  return (
    <div className="max-w-5xl space-y-4">
      <PageHeader title="Taggers" subtitle="Train taggers on each corpus's gold documents, measure them on its test split and compare them." />
      {corpora.isPending ? (
        <Skeleton shape="table" />
      ) : corpora.isError ? (
        <Notice tone="error">{corpora.error.message}</Notice>
      ) : list.length === 0 ? (
        <EmptyState title="No corpora yet">Taggers are trained per corpus; a manager creates corpora.</EmptyState>
      ) : (
        <ul className="divide-y divide-ink-50 rounded-lg border border-ink-100 bg-white" aria-label="Corpora and their taggers">
          {list.map((c) => (
            <li key={c.id} className="flex flex-wrap items-center justify-between gap-2 px-4 py-3">
              <div>
                <Link className="font-medium text-ink-900 hover:underline" to={paths.org.corpusTraining.build(orgId, c.id)}>
                  {c.name}
                </Link>
                <div className="text-xs text-ink-500">
                  {countOf(c.documentCount, "document")} · {countOf(c.entityTypeCount, "entity type")}
                </div>
              </div>
              <CorpusTaggers orgId={orgId} corpusId={c.id} />
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
