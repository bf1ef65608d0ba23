import type { Table, flexRender as FlexRender } from "@tanstack/react-table";
import { cn } from "@/lib/cn";

/** Renders a TanStack table with the product's table style. */
export function DataTable<T>({
  table,
  flexRender,
  caption,
  className,
  rowClassName,
}: {
  table: Table<T>;
  flexRender: typeof FlexRender;
  caption: string;
  className?: string;
  rowClassName?: (row: T) => string | undefined;
}) {
  return (
    // relative: screen-reader-only text in far cells is positioned absolutely; without a positioned
    // scroll box it would escape the box and widen the whole page on a phone.
    // tabIndex and a name: a box that scrolls sideways on a phone must be reachable from the keyboard.
    <div role="region" aria-label={caption} tabIndex={0} className={cn("relative overflow-x-auto rounded-lg border border-ink-100 bg-white focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-ink-500", className)}>
      <table className="w-full text-left text-sm">
        <caption className="sr-only">{caption}</caption>
        <thead className="border-b border-ink-100 bg-ink-50/60 text-xs tracking-wide text-ink-500 uppercase">
          {table.getHeaderGroups().map((hg) => (
            <tr key={hg.id}>
              {hg.headers.map((h) => (
                <th key={h.id} scope="col" className="px-4 py-2.5 font-semibold">
                  {h.isPlaceholder ? null : flexRender(h.column.columnDef.header, h.getContext())}
                </th>
              ))}
            </tr>
          ))}
        </thead>
        <tbody className="divide-y divide-ink-50">
          {table.getRowModel().rows.map((row) => (
            <tr key={row.id} className={cn("hover:bg-ink-50/40", rowClassName?.(row.original))}>
              {row.getVisibleCells().map((cell) => (
                <td key={cell.id} className="px-4 py-2.5 align-middle text-ink-800">
                  {flexRender(cell.column.columnDef.cell, cell.getContext())}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
