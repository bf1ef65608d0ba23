import { createColumnHelper, getCoreRowModel, useReactTable } from "@tanstack/react-table";
import { act, render } from "@testing-library/react";
import { describe, expect, it } from "vitest";
import { useDataTable } from "./use-data-table";

type Row = { name: string };
const col = createColumnHelper<Row>();
const columns = [col.accessor("name", { header: "Name" })];

/**
 * Renders a table whose rows are a new array on every render, as the screens build them; after
 * `cap` renders the rows stay one array, so a loop ends there instead of hanging the test.
 */
function probe(useTable: typeof useDataTable | "raw", cap = 40) {
  const renders = { count: 0 };
  const frozen: Row[] = [{ name: "frozen" }];
  function Rows({ tick }: { tick: number }) {
    renders.count += 1;
    const rows: Row[] = renders.count > cap ? frozen : [{ name: `row ${tick}` }];
    // Which hook is fixed per probe, so the hook order never changes between renders.
    const table = useTable === "raw" ? useReactTable({ data: rows, columns, getCoreRowModel: getCoreRowModel() }) : useTable({ data: rows, columns });
    return <p>{table.getRowModel().rows.map((r) => r.original.name).join(",")}</p>;
  }
  return { Rows, renders };
}

async function flushMicrotasks(times: number): Promise<void> {
  for (let i = 0; i < times; i++) await act(async () => await Promise.resolve());
}

describe("useDataTable", () => {
  // From reading TanStack Table 8.21 (table-core, RowPagination `_autoResetPageIndex`): a new
  // `data` array queues a page-index reset in a microtask, and that reset is a state update.
  it("settles after a re-render even though the rows are a new array each time", async () => {
    const { Rows, renders } = probe(useDataTable);
    const view = render(<Rows tick={0} />);
    // The table arms its resets a microtask after its first rows; a later render then trips one.
    await flushMicrotasks(2);
    view.rerender(<Rows tick={1} />);
    await flushMicrotasks(5);
    const settled = renders.count;
    await flushMicrotasks(20);
    expect(renders.count).toBe(settled);
    expect(renders.count).toBeLessThan(10);
    expect(view.container.textContent).toBe("row 1");
  });

  it("guards against a loop the plain hook falls into with the same rows", async () => {
    const { Rows, renders } = probe("raw");
    const view = render(<Rows tick={0} />);
    // The table arms its resets a microtask after its first rows; a later render then trips one.
    await flushMicrotasks(2);
    view.rerender(<Rows tick={1} />);
    await flushMicrotasks(5);
    // Each queued reset renders, which queues the next one, until the rows stop changing.
    expect(renders.count).toBeGreaterThan(40);
    expect(view.container.textContent).toBe("frozen");
  });
});
