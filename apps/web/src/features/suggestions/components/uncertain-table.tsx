import type { UncertainRanking } from "@tagloom/contracts";
import { useState } from "react";
import { Link } from "react-router";
import { Field, Input } from "@/components/ui/field";
import { formatCount } from "@/lib/format";

/**
 * Documents without gold, most uncertain first, with the score and a plain reason. The manager
 * picks the top N (or ticks rows) and goes to the batch form with them.
 */
export function UncertainTable({
  ranking,
  linkTo,
  batchLink,
}: {
  ranking: UncertainRanking;
  linkTo: (documentId: string) => string;
  batchLink?: ((documentIds: string[]) => string) | undefined;
}) {
  const [top, setTop] = useState(Math.min(10, ranking.items.length));
  const [picked, setPicked] = useState<Set<string> | null>(null);
  const selected = picked ?? new Set(ranking.items.slice(0, top).map((d) => d.id));
  const ids = ranking.items.filter((d) => selected.has(d.id)).map((d) => d.id);
  return (
    <div className="space-y-3">
      {batchLink ? (
        <div className="flex flex-wrap items-end gap-3">
          <div className="w-40">
            <Field label="Select the top">
              {(id) => (
                <Input
                  id={id}
                  type="number"
                  min={0}
                  max={ranking.items.length}
                  value={top}
                  onChange={(e) => {
                    setTop(Math.max(0, Math.min(ranking.items.length, Number(e.target.value) || 0)));
                    setPicked(null);
                  }}
                />
              )}
            </Field>
          </div>
          {ids.length > 0 ? (
            <Link className="inline-flex h-10 items-center rounded-md bg-ink-700 px-4 text-sm font-medium text-white hover:bg-ink-800" to={batchLink(ids)}>
              Make a batch of {ids.length}…
            </Link>
          ) : (
            <span className="pb-2 text-sm text-ink-500">Select documents to make a batch.</span>
          )}
        </div>
      ) : null}
      <div className="overflow-x-auto rounded-lg border border-ink-100 bg-white">
        <table className="w-full text-left text-sm">
          <caption className="sr-only">Most uncertain documents</caption>
          <thead className="border-b border-ink-100 bg-ink-50/60 text-xs tracking-wide text-ink-500 uppercase">
            <tr>
              {batchLink ? (
                <th scope="col" className="w-10 px-4 py-2.5">
                  <span className="sr-only">Selected</span>
                </th>
              ) : null}
              <th scope="col" className="px-4 py-2.5 font-semibold">
                Rank
              </th>
              <th scope="col" className="px-4 py-2.5 font-semibold">
                Document
              </th>
              <th scope="col" className="px-4 py-2.5 text-right font-semibold">
                Uncertainty
              </th>
              <th scope="col" className="px-4 py-2.5 font-semibold">
                Why
              </th>
            </tr>
          </thead>
          <tbody>
            {ranking.items.map((d, i) => (
              <tr key={d.id} className="border-b border-ink-50 last:border-0" data-testid="uncertain-row">
                {batchLink ? (
                  <td className="px-4 py-2">
                    <input
                      type="checkbox"
                      aria-label={`Select ${d.title}`}
                      checked={selected.has(d.id)}
                      onChange={(e) => {
                        const next = new Set(selected);
                        if (e.target.checked) next.add(d.id);
                        else next.delete(d.id);
                        setPicked(next);
                      }}
                    />
                  </td>
                ) : null}
                <td className="px-4 py-2 text-ink-500 tabular-nums">{i + 1}</td>
                <td className="px-4 py-2">
                  <Link className="font-medium text-ink-900 hover:underline" to={linkTo(d.id)}>
                    {d.title}
                  </Link>
                  <span className="ml-2 text-xs text-ink-500">{formatCount(d.tokenCount)} tokens</span>
                </td>
                <td className="px-4 py-2 text-right tabular-nums" title={`Least confidence ${d.leastConfidence.toFixed(3)}`}>
                  {d.score.toFixed(3)}
                </td>
                <td className="px-4 py-2 text-ink-700">{d.reason}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
