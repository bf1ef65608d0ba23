import { type CorpusSummary, runStatusLabels } from "@tagloom/contracts";
import { Link } from "react-router";
import { Skeleton } from "@/components/ui/card";
import { paths } from "@/config/paths";
import { useLatestRuns } from "@/features/overview/api/get-latest-runs";
import { useSuggester } from "@/features/suggestions/api/get-suggester";
import { formatAgo } from "@/lib/dates";
import { OverviewSection } from "./section";

const f1Text = (f1: number | null | undefined) => (f1 == null ? "no score" : `F1 ${f1.toFixed(2)}`);

/** Per corpus (the first few): the suggester in use with its F1 on held-out documents, and the newest training runs. */
export function TrainingSection({ orgId, corpora }: { orgId: string; corpora: CorpusSummary[] }) {
  return (
    <OverviewSection title="Taggers and runs" link={{ to: paths.org.taggers.build(orgId), text: "Taggers" }}>
      {corpora.length === 0 ? <p className="text-sm text-ink-500">No corpora yet.</p> : null}
      <ul className="space-y-4 text-sm">
        {corpora.map((c) => (
          <CorpusTraining key={c.id} orgId={orgId} corpus={c} />
        ))}
      </ul>
    </OverviewSection>
  );
}

function CorpusTraining({ orgId, corpus }: { orgId: string; corpus: CorpusSummary }) {
  const suggester = useSuggester(orgId, corpus.id);
  const runs = useLatestRuns(orgId, corpus.id);
  const current = suggester.data?.tagger ?? null;
  const currentF1 = current ? suggester.data?.candidates.find((t) => t.id === current.id)?.f1 : null;
  return (
    <li className="space-y-1">
      <Link to={paths.org.corpusSuggester.build(orgId, corpus.id)} className="font-medium text-ink-800 hover:underline">
        {corpus.name}
      </Link>
      <p className="text-ink-700">
        Suggester: {suggester.isPending ? "…" : current ? `${current.name} · ${f1Text(currentF1)}` : "none chosen"}
      </p>
      {runs.isPending ? (
        <Skeleton rows={1} />
      ) : runs.isError ? (
        <p className="text-rust-500">{runs.error.message}</p>
      ) : runs.data.items.length === 0 ? (
        <p className="text-ink-500">No training runs yet.</p>
      ) : (
        <ul className="text-ink-700">
          {runs.data.items.map((r) => (
            <li key={r.id} className="flex flex-wrap justify-between gap-x-3">
              <span>
                Run {r.number} · {runStatusLabels[r.status]}
                {r.evaluation ? ` · ${f1Text(r.evaluation.overall.f1)}` : ""}
              </span>
              <span className="text-ink-500">{formatAgo(r.createdAt)}</span>
            </li>
          ))}
        </ul>
      )}
    </li>
  );
}
