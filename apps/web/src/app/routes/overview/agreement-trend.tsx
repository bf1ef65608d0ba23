import type { BatchSummary } from "@tagloom/contracts";
import { useQueries } from "@tanstack/react-query";
import { CartesianGrid, Line, LineChart, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { Skeleton } from "@/components/ui/card";
import { paths } from "@/config/paths";
import { batchAgreementQueryOptions } from "@/features/batches/api/get-batch-agreement";
import { OverviewSection } from "./section";

/** How many of the newest batches the trend follows. */
const BATCHES_SHOWN = 8;

/** Entity F1 between annotators, batch by batch (oldest first), for batches where two people did the same documents. */
export function AgreementTrendSection({ orgId, batches }: { orgId: string; batches: BatchSummary[] }) {
  const shared = batches
    .filter((b) => b.annotatorsPerDocument > 1)
    .slice(0, BATCHES_SHOWN)
    .reverse();
  const results = useQueries({ queries: shared.map((b) => batchAgreementQueryOptions(orgId, b.corpusId, b.id)) });
  const pending = results.some((r) => r.isPending);
  const points = shared.flatMap((b, i) => {
    const overall = results[i]?.data?.overall;
    return overall ? [{ name: b.name, f1: Math.round(overall.f1 * 100) / 100, documents: overall.documents }] : [];
  });
  return (
    <OverviewSection title="Agreement trend" link={{ to: paths.org.batches.build(orgId), text: "All batches" }}>
      {pending ? (
        <Skeleton rows={2} />
      ) : points.length === 0 ? (
        <p className="text-sm text-ink-500">No agreement yet: it needs documents that two annotators have both finished.</p>
      ) : (
        <>
          {points.length > 1 ? (
            <div className="h-40" role="img" aria-label={`Entity F1 between annotators over ${points.length} batches`}>
              <ResponsiveContainer width="100%" height="100%">
                <LineChart data={points} margin={{ top: 8, right: 12, bottom: 0, left: -20 }}>
                  <CartesianGrid stroke="#d9e4ef" vertical={false} />
                  <XAxis dataKey="name" tick={false} stroke="#86a3c2" />
                  <YAxis domain={[0, 1]} ticks={[0, 0.5, 1]} stroke="#86a3c2" fontSize={11} />
                  <Tooltip />
                  <Line type="monotone" dataKey="f1" name="Entity F1" stroke="#1d3557" strokeWidth={2} dot={{ r: 3 }} isAnimationActive={false} />
                </LineChart>
              </ResponsiveContainer>
            </div>
          ) : null}
          <ul className="text-sm text-ink-700">
            {points.map((p) => (
              <li key={p.name} className="flex justify-between gap-3">
                <span className="min-w-0 truncate">{p.name}</span>
                <span className="shrink-0 tabular-nums">
                  F1 {p.f1.toFixed(2)} <span className="text-ink-500">· {p.documents} doc.</span>
                </span>
              </li>
            ))}
          </ul>
        </>
      )}
    </OverviewSection>
  );
}
