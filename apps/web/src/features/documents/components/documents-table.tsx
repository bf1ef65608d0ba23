import { type AnnotationStatus, type DocumentListItem, type DocumentSort, annotationStatusLabels, annotationStatusStates, annotationStatuses, countOf, splitLabels } from "@tagloom/contracts";
import { createColumnHelper, flexRender, type RowSelectionState } from "@tanstack/react-table";
import { useDataTable } from "@/components/ui/use-data-table";
import { type ReactNode, useEffect, useState } from "react";
import { Link } from "react-router";
import { Button } from "@/components/ui/button";
import { DataTable } from "@/components/ui/data-table";
import { EmptyState, Notice, Skeleton } from "@/components/ui/card";
import { Field, Input, Select } from "@/components/ui/field";
import { StateBadge } from "@/components/ui/state-badge";
import { useToast } from "@/components/ui/toaster";
import { formatDateTime } from "@/lib/dates";
import { formatCount } from "@/lib/format";
import { type DocumentsParams, useDocuments } from "../api/get-documents";
import { useSetSplit } from "../api/set-split";
import { UserText } from "@/components/ui/user-text";

const col = createColumnHelper<DocumentListItem>();
type SplitFilter = "" | "train" | "test" | "none";

/** What the cells need from the screen; passed as table meta so the columns stay the same objects between renders. */
type TableMeta = { linkTo: (documentId: string) => string; sort: DocumentSort; dir: "asc" | "desc"; onSort: (s: DocumentSort) => void };
const metaOf = (table: { options: { meta?: unknown } }) => table.options.meta as TableMeta;

// Defined once: TanStack's flexRender treats a cell function as a component, so a new function
// on every render would remount every cell (and lose focus and hover state).
const selectColumn = col.display({
  id: "select",
  header: ({ table }) => (
    <input
      type="checkbox"
      aria-label="Select all on this page"
      checked={table.getIsAllRowsSelected()}
      ref={(el) => {
        if (el) el.indeterminate = table.getIsSomeRowsSelected();
      }}
      onChange={table.getToggleAllRowsSelectedHandler()}
    />
  ),
  cell: ({ row }) => <input type="checkbox" aria-label={`Select ${row.original.title}`} checked={row.getIsSelected()} onChange={row.getToggleSelectedHandler()} />,
});
const sortHeader = (label: string, sort: DocumentSort) =>
  function Header({ table }: { table: { options: { meta?: unknown } } }) {
    const m = metaOf(table);
    return <SortButton label={label} sort={sort} current={m.sort} dir={m.dir} onSort={m.onSort} />;
  };
const dataColumns = [
  col.accessor("title", {
    header: sortHeader("Title", "title"),
    cell: (c) => (
      <Link to={metaOf(c.table).linkTo(c.row.original.id)} className="font-medium text-ink-800 underline-offset-2 hover:underline">
        <UserText>{c.getValue()}</UserText>
      </Link>
    ),
  }),
  col.accessor("filename", { header: "File", cell: (c) => <UserText className="text-ink-500">{c.getValue() ?? "—"}</UserText> }),
  col.accessor("tokenCount", { header: sortHeader("Tokens", "tokens"), cell: (c) => <span className="tabular-nums">{formatCount(c.getValue())}</span> }),
  col.accessor("split", { header: "Split", cell: (c) => splitLabels[c.getValue() ?? "none"] }),
  col.accessor("annotationStatus", { header: "Status", cell: (c) => <StateBadge state={annotationStatusStates[c.getValue()]} /> }),
  col.accessor("createdAt", {
    header: sortHeader("Added", "created"),
    cell: (c) => <span className="whitespace-nowrap text-ink-500">{formatDateTime(c.getValue())}</span>,
  }),
];
const managerColumns = [selectColumn, ...dataColumns];

function useDebounced<T>(value: T, ms: number): T {
  const [v, setV] = useState(value);
  useEffect(() => {
    const t = setTimeout(() => setV(value), ms);
    return () => clearTimeout(t);
  }, [value, ms]);
  return v;
}

function SortButton({ label, sort, current, dir, onSort }: { label: string; sort: DocumentSort; current: DocumentSort; dir: "asc" | "desc"; onSort: (s: DocumentSort) => void }) {
  const active = sort === current;
  return (
    <button type="button" className="inline-flex items-center gap-1 uppercase hover:text-ink-800" aria-label={`Sort by ${label}`} onClick={() => onSort(sort)}>
      {label}
      <span aria-hidden className={active ? "text-ink-800" : "text-ink-200"}>
        {active && dir === "asc" ? "▲" : "▼"}
      </span>
      {active ? <span className="sr-only">{dir === "asc" ? "ascending" : "descending"}</span> : null}
    </button>
  );
}

/**
 * The Documents table: server-side pages by cursor, sort by date, title or size, filters by split
 * and annotation status, search by words, and (for managers) selection to set the split.
 * `refetchMs` keeps it refreshing while files are still being processed.
 */
export function DocumentsTable({
  orgId,
  corpusId,
  canManage,
  refetchMs,
  linkTo,
  onRandomSplit,
  selectionActions,
}: {
  orgId: string;
  corpusId: string;
  canManage: boolean;
  refetchMs: number | false;
  linkTo: (documentId: string) => string;
  onRandomSplit?: () => void;
  /** More actions on the selected documents, composed in by the screen (e.g. making a batch). */
  selectionActions?: (documentIds: string[]) => ReactNode;
}) {
  const [sort, setSort] = useState<DocumentSort>("created");
  const [dir, setDir] = useState<"asc" | "desc">("desc");
  const [split, setSplit] = useState<SplitFilter>("");
  const [status, setStatus] = useState<AnnotationStatus | "">("");
  const [search, setSearch] = useState("");
  const q = useDebounced(search.trim(), 300);
  // Cursors belong to one sort and filter: a change starts again from the first page.
  const signature = JSON.stringify([sort, dir, split, status, q]);
  const [paging, setPaging] = useState<{ signature: string; cursors: string[] }>({ signature, cursors: [] });
  const cursors = paging.signature === signature ? paging.cursors : [];
  const setCursors = (update: (c: string[]) => string[]) => setPaging({ signature, cursors: update(cursors) });
  const [selection, setSelection] = useState<RowSelectionState>({});
  const toast = useToast();
  const setSplitMutation = useSetSplit(orgId, corpusId);

  const params: DocumentsParams = { sort, dir, split: split || undefined, status: status || undefined, q: q || undefined, cursor: cursors[cursors.length - 1] };
  const docs = useDocuments(orgId, corpusId, params, refetchMs);

  const onSort = (s: DocumentSort) => {
    if (s === sort) setDir((d) => (d === "asc" ? "desc" : "asc"));
    else {
      setSort(s);
      setDir(s === "title" ? "asc" : "desc");
    }
  };


  const meta: TableMeta = { linkTo, sort, dir, onSort };
  const table = useDataTable({
    data: docs.data?.items ?? [],
    columns: canManage ? managerColumns : dataColumns,
    meta,
    getRowId: (d) => d.id,
    enableRowSelection: canManage,
    state: { rowSelection: selection },
    onRowSelectionChange: setSelection,
  });
  const selectedIds = Object.keys(selection).filter((k) => selection[k]);

  const applySplit = async (value: "train" | "test" | null) => {
    try {
      const r = await setSplitMutation.mutateAsync({ documentIds: selectedIds, split: value });
      const n = r.train + r.test + r.cleared;
      toast.show(value ? `${countOf(n, "document")} set to ${value}.` : `Split cleared on ${countOf(n, "document")}.`, "success");
      setSelection({});
    } catch (err) {
      toast.show((err as Error).message, "error");
    }
  };

  return (
    <section className="space-y-3" aria-label="Documents">
      <div className="grid gap-3 rounded-lg border border-ink-100 bg-white p-4 sm:grid-cols-[1fr_10rem_12rem]">
        <Field label="Search" hint='Words, "a phrase", or -word to leave out'>
          {(id, d) => <Input id={id} type="search" aria-describedby={d} placeholder="Find documents by a word in them" value={search} onChange={(e) => setSearch(e.target.value)} />}
        </Field>
        <Field label="Split">
          {(id) => (
            <Select id={id} value={split} onChange={(e) => setSplit(e.target.value as SplitFilter)}>
              <option value="">Any</option>
              <option value="train">Train</option>
              <option value="test">Test</option>
              <option value="none">Neither</option>
            </Select>
          )}
        </Field>
        <Field label="Annotation status">
          {(id) => (
            <Select id={id} value={status} onChange={(e) => setStatus(e.target.value as AnnotationStatus | "")}>
              <option value="">Any</option>
              {(annotationStatuses).map((s) => (
                <option key={s} value={s}>
                  {annotationStatusLabels[s]}
                </option>
              ))}
            </Select>
          )}
        </Field>
      </div>

      {canManage ? (
        <div className="flex flex-wrap items-center gap-2 text-sm" aria-label="Split actions">
          {selectedIds.length ? (
            <>
              <span className="text-ink-700">{formatCount(selectedIds.length)} selected:</span>
              <Button size="sm" variant="secondary" busy={setSplitMutation.isPending} onClick={() => void applySplit("train")}>
                Set train
              </Button>
              <Button size="sm" variant="secondary" busy={setSplitMutation.isPending} onClick={() => void applySplit("test")}>
                Set test
              </Button>
              <Button size="sm" variant="ghost" busy={setSplitMutation.isPending} onClick={() => void applySplit(null)}>
                Clear split
              </Button>
              {selectionActions?.(selectedIds)}
            </>
          ) : (
            <span className="text-ink-500">Select documents to set their split, or</span>
          )}
          {onRandomSplit ? (
            <Button size="sm" variant="ghost" onClick={onRandomSplit}>
              Random split…
            </Button>
          ) : null}
        </div>
      ) : null}

      {docs.isPending ? (
        <Skeleton shape="table" />
      ) : docs.isError ? (
        <Notice tone="error">{docs.error.message}</Notice>
      ) : docs.data.items.length === 0 ? (
        <EmptyState title={q || split || status ? "No documents match" : "No documents yet"}>
          {q || split || status ? "Try other words or filters." : "Upload files to add documents."}
        </EmptyState>
      ) : (
        <DataTable table={table} flexRender={flexRender} caption="Documents" />
      )}

      <div className="flex items-center gap-2 text-sm">
        <Button size="sm" variant="secondary" disabled={cursors.length === 0} onClick={() => setCursors((c) => c.slice(0, -1))}>
          Previous
        </Button>
        <span className="text-ink-500">Page {cursors.length + 1}</span>
        <Button size="sm" variant="secondary" disabled={!docs.data?.nextCursor} onClick={() => docs.data?.nextCursor && setCursors((c) => [...c, docs.data.nextCursor!])}>
          Next
        </Button>
        {docs.isFetching && !docs.isPending ? <span className="text-xs text-ink-500">Refreshing…</span> : null}
      </div>
    </section>
  );
}
