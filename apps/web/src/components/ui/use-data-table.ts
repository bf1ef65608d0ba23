import { type RowData, type TableOptions, getCoreRowModel, useReactTable } from "@tanstack/react-table";

/**
 * `useReactTable` the way every table here uses it: core rows only, and no automatic reset of the
 * page index. We never paginate on the client, but TanStack Table still queues a page-index reset
 * (a state update of the table's own) whenever `data` is a new array, and the screens build their
 * rows in render (`rows.map(...)`, `items ?? []`). Each reset re-renders, the new render makes a
 * new array, which queues the next reset: a render loop that never ends. The page stays painted,
 * but each of those updates outranks a router navigation (a transition), so the navigation never
 * commits and the URL changes while the old screen stays up.
 */
export function useDataTable<T extends RowData>(options: Omit<TableOptions<T>, "getCoreRowModel"> & Partial<Pick<TableOptions<T>, "getCoreRowModel">>) {
  return useReactTable<T>({ getCoreRowModel: getCoreRowModel(), ...options, autoResetPageIndex: false });
}
