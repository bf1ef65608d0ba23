import { can, countOf } from "@tagloom/contracts";
import { Link, NavLink, Outlet, useParams } from "react-router";
import { Notice, PageHeader, Skeleton } from "@/components/ui/card";
import { paths } from "@/config/paths";
import { useCorpus } from "@/features/corpora/api/get-corpus";
import { ExportButtons } from "@/features/exports/components/export-buttons";
import { useCurrentOrg } from "@/features/orgs/hooks/use-current-org";
import { useFileViewsSync } from "@/features/uploads/api/sync-file-views";
import { cn } from "@/lib/cn";
import { formatCount } from "@/lib/format";
import { NotFoundRoute } from "./not-found";

/** A corpus: its name and counts, export links, and tabs for documents, schema, uploads, settings. */
export function CorpusLayoutRoute() {
  const org = useCurrentOrg();
  const { corpusId = "" } = useParams();
  const corpus = useCorpus(org.organizationId, corpusId);
  // While files are being read, the header, the files table and upload results refresh together.
  useFileViewsSync(org.organizationId, corpusId, (corpus.data?.pendingFiles ?? 0) > 0);
  if (corpus.isPending) return <Skeleton />;
  if (corpus.isError) {
    if ("status" in corpus.error && corpus.error.status === 404) return <NotFoundRoute />;
    return <Notice tone="error">{corpus.error.message}</Notice>;
  }
  const c = corpus.data;
  const orgId = org.organizationId;
  // Annotators see a corpus's schema and guidelines only, never its documents, gold or uploads.
  const data = can(org.role, "viewCorpusData");
  const tabs = [
    ...(data ? [{ label: "Documents", to: paths.org.corpus.build(orgId, corpusId), end: true }] : []),
    { label: data ? "Entity schema" : "Entity schema and guidelines", to: paths.org.corpusSchema.build(orgId, corpusId) },
    ...(data ? [{ label: "Uploads", to: paths.org.corpusUploads.build(orgId, corpusId) }] : []),
    ...(data ? [{ label: "Suggester", to: paths.org.corpusSuggester.build(orgId, corpusId) }] : []),
    ...(can(org.role, "viewTraining") ? [{ label: "Training", to: paths.org.corpusTraining.build(orgId, corpusId) }] : []),
    ...(can(org.role, "manageBatches") || can(org.role, "train") ? [{ label: "Most uncertain", to: paths.org.corpusUncertain.build(orgId, corpusId) }] : []),
    ...(can(org.role, "manageCorpora") ? [{ label: "Settings", to: paths.org.corpusSettings.build(orgId, corpusId) }] : []),
  ];
  return (
    <div className="max-w-6xl space-y-4">
      <p className="text-sm">
        <Link to={paths.org.corpora.build(orgId)} className="text-ink-500 hover:underline">
          Corpora
        </Link>
      </p>
      <PageHeader
        title={
          <span>
            {c.name}
            {c.archivedAt ? <span className="ml-3 rounded bg-ink-50 px-2 py-0.5 align-middle text-xs font-medium text-ink-500">archived</span> : null}
          </span>
        }
        subtitle={
          <span data-testid="corpus-counts">
            {c.description ? `${c.description} · ` : ""}
            {countOf(c.documentCount, "document")} ({formatCount(c.splits.train)} train, {formatCount(c.splits.test)} test) · {formatCount(c.statuses.gold)} gold ·{" "}
            {countOf(c.entityTypeCount, "entity type")}
            {c.pendingFiles > 0 ? ` · ${countOf(c.pendingFiles, "file")} being read` : ""}
          </span>
        }
        actions={can(org.role, "exportData") ? <ExportButtons orgId={orgId} corpusId={corpusId} goldCount={c.statuses.gold} /> : null}
      />
      <nav aria-label="Corpus" className="flex flex-wrap gap-x-1 border-b border-ink-100">
        {tabs.map((t) => (
          <NavLink
            key={t.label}
            to={t.to}
            end={t.end}
            className={({ isActive }) =>
              cn("-mb-px border-b-2 border-transparent px-3 py-2 text-sm whitespace-nowrap text-ink-500 hover:text-ink-800", isActive && "border-thread-500 font-medium text-ink-900")
            }
          >
            {t.label}
          </NavLink>
        ))}
      </nav>
      <Outlet />
    </div>
  );
}
