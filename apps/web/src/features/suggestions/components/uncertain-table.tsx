import { type UncertainDocument, type UncertainRanking, countOf } from "@tagloom/contracts";
import { createColumnHelper, flexRender } from "@tanstack/react-table";
import { useDataTable } from "@/components/ui/use-data-table";
import { useMemo, useState } from "react";
import { Link } from "react-router";
import { DataTable } from "@/components/ui/data-table";
import { Field, Input } from "@/components/ui/field";
import { useMediaQuery } from "../hooks/use-media-query";

const col = createColumnHelper<UncertainDocument>();

/** Below Tailwind's `sm` (640 px) the rank and the reason join the document's cell instead of having columns of their own. */
export const NARROW_QUERY = "(max-width: 639.98px)";

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
  // Rank and "Why" columns need sideways scrolling on a phone; stacked with the name they need none.
  const narrow = useMediaQuery(NARROW_QUERY);
  const columns = useMemo(
    () => [
      ...(batchLink
        ? [
            col.display({
              id: "selected",
              header: () => <span className="sr-only">Selected</span>,
              cell: (c) => (
                <input
                  type="checkbox"
                  aria-label={`Select ${c.row.original.title}`}
                  checked={selected.has(c.row.original.id)}
                  onChange={(e) => {
                    const next = new Set(selected);
                    if (e.target.checked) next.add(c.row.original.id);
                    else next.delete(c.row.original.id);
                    setPicked(next);
                  }}
                />
              ),
            }),
          ]
        : []),
      col.display({ id: "rank", header: "Rank", cell: (c) => <span className="text-ink-500 tabular-nums">{c.row.index + 1}</span> }),
      col.accessor("title", {
        header: "Document",
        cell: (c) =>
          narrow ? (
            <div className="min-w-0 space-y-0.5">
              <div>
                <span className="mr-1.5 text-ink-500 tabular-nums">
                  <span className="sr-only">Rank </span>
                  {c.row.index + 1}.
                </span>
                <Link className="font-medium break-words text-ink-900 hover:underline" to={linkTo(c.row.original.id)}>
                  {c.getValue()}
                </Link>
              </div>
              <p className="text-xs text-ink-500">{countOf(c.row.original.tokenCount, "token")}</p>
              <p className="text-xs text-ink-700" data-testid="uncertain-reason">
                <span className="sr-only">Why: </span>
                {c.row.original.reason}
              </p>
            </div>
          ) : (
            <span className="whitespace-nowrap">
              <Link className="font-medium text-ink-900 hover:underline" to={linkTo(c.row.original.id)}>
                {c.getValue()}
              </Link>
              <span className="ml-2 text-xs text-ink-500">{countOf(c.row.original.tokenCount, "token")}</span>
            </span>
          ),
      }),
      col.accessor("score", {
        header: () => <span className="block text-right">Uncertainty</span>,
        cell: (c) => (
          <span className="block text-right tabular-nums" title={`Least confidence ${c.row.original.leastConfidence.toFixed(3)}`}>
            {c.getValue().toFixed(3)}
          </span>
        ),
      }),
      col.accessor("reason", { header: "Why", cell: (c) => <span className="text-ink-700" data-testid="uncertain-reason">{c.getValue()}</span> }),
    ],
    [batchLink, linkTo, selected, narrow],
  );
  const table = useDataTable({ data: ranking.items, columns, getRowId: (d) => d.id, state: { columnVisibility: { rank: !narrow, reason: !narrow } } });
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
      <DataTable table={table} flexRender={flexRender} caption="Most uncertain documents" />
    </div>
  );
}
