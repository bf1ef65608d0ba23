import { annotationStatusLabels, annotationStatusStates, annotationStatuses } from "@tagloom/contracts";
import { useEffect, useState } from "react";
import { Button } from "@/components/ui/button";
import { Notice, Skeleton } from "@/components/ui/card";
import { Input, Select } from "@/components/ui/field";
import { StateBadge } from "@/components/ui/state-badge";
import { type CandidateFilter, useBatchCandidates } from "../api/get-batch-candidates";
import { UserText } from "@/components/ui/user-text";

/** Picks documents of a corpus for a batch: search, filter by status, tick rows or all shown. */
export function DocumentPicker({
  orgId,
  corpusId,
  selected,
  onChange,
  onTitles,
}: {
  orgId: string;
  corpusId: string;
  selected: string[];
  onChange: (ids: string[]) => void;
  onTitles: (titles: Map<string, string>) => void;
}) {
  const [q, setQ] = useState("");
  const [filter, setFilter] = useState<CandidateFilter>({});
  const docs = useBatchCandidates(orgId, corpusId, filter);
  const rows = docs.data?.pages.flatMap((p) => p.items) ?? [];
  // Tell the form the titles of the documents seen so far (for the by-hand table).
  const pages = docs.data;
  useEffect(() => {
    const seen = pages?.pages.flatMap((p) => p.items) ?? [];
    if (seen.length) onTitles(new Map(seen.map((r) => [r.id, r.title])));
  }, [pages, onTitles]);
  const find = () => setFilter((f) => ({ ...f, q: q.trim() || undefined }));
  const chosen = new Set(selected);
  const toggle = (id: string) => onChange(chosen.has(id) ? selected.filter((x) => x !== id) : [...selected, id]);
  const shownIds = rows.map((r) => r.id);
  const allShown = shownIds.length > 0 && shownIds.every((id) => chosen.has(id));
  return (
    <div className="space-y-3">
      {/* Not a form of its own: it sits inside the batch form. */}
      <div className="flex flex-wrap items-end gap-2">
        <label className="text-sm">
          <span className="sr-only">Find documents</span>
          <Input
            value={q}
            onChange={(e) => setQ(e.target.value)}
            onKeyDown={(e) => {
              if (e.key !== "Enter") return;
              e.preventDefault();
              find();
            }}
            placeholder="Find words in title or text"
            className="w-64"
          />
        </label>
        <label className="text-sm">
          <span className="sr-only">Status</span>
          <Select
            value={filter.status ?? ""}
            onChange={(e) => setFilter((f) => ({ ...f, status: (e.target.value || undefined) as CandidateFilter["status"] }))}
            className="w-48"
          >
            <option value="">Any status</option>
            {annotationStatuses.map((s) => (
              <option key={s} value={s}>
                {annotationStatusLabels[s]}
              </option>
            ))}
          </Select>
        </label>
        <Button type="button" variant="secondary" size="sm" onClick={find}>
          Find
        </Button>
        <span className="ml-auto text-sm text-ink-700">
          <strong>{selected.length}</strong> selected
        </span>
        {selected.length ? (
          <Button type="button" variant="ghost" size="sm" onClick={() => onChange([])}>
            Clear
          </Button>
        ) : null}
      </div>
      {docs.isPending ? (
        <Skeleton shape="table" />
      ) : docs.isError ? (
        <Notice tone="error">{docs.error.message}</Notice>
      ) : rows.length ? (
        <div className="max-h-80 overflow-auto rounded-md border border-ink-100">
          <table className="w-full text-sm">
            <caption className="sr-only">Documents to pick</caption>
            <thead className="sticky top-0 bg-ink-50 text-xs text-ink-500">
              <tr>
                <th scope="col" className="w-10 px-3 py-2">
                  <input
                    type="checkbox"
                    aria-label="Select all shown"
                    checked={allShown}
                    onChange={() => onChange(allShown ? selected.filter((id) => !shownIds.includes(id)) : [...new Set([...selected, ...shownIds])])}
                  />
                </th>
                <th scope="col" className="px-3 py-2 text-left">Title</th>
                <th scope="col" className="px-3 py-2 text-right">Words</th>
                <th scope="col" className="px-3 py-2 text-left">Status</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-ink-50">
              {rows.map((r) => (
                <tr key={r.id} className="hover:bg-ink-50/50">
                  <td className="px-3 py-1.5">
                    <input type="checkbox" aria-label={`Pick ${r.title}`} checked={chosen.has(r.id)} onChange={() => toggle(r.id)} />
                  </td>
                  <td className="px-3 py-1.5 text-ink-800"><UserText>{r.title}</UserText></td>
                  <td className="px-3 py-1.5 text-right tabular-nums">{r.tokenCount.toLocaleString("en")}</td>
                  <td className="px-3 py-1.5">
                    <StateBadge state={annotationStatusStates[r.annotationStatus]} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
          {docs.hasNextPage ? (
            <div className="p-2">
              <Button type="button" size="sm" variant="secondary" busy={docs.isFetchingNextPage} onClick={() => void docs.fetchNextPage()}>
                Show more documents
              </Button>
            </div>
          ) : null}
        </div>
      ) : (
        <p className="text-sm text-ink-500">No documents match. Upload documents to the corpus first.</p>
      )}
    </div>
  );
}
