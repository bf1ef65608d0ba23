import type { BillingInvoice } from "@tagloom/contracts";
import { createColumnHelper, flexRender } from "@tanstack/react-table";
import { useMemo } from "react";
import { DataTable } from "@/components/ui/data-table";
import { useDataTable } from "@/components/ui/use-data-table";
import { cn } from "@/lib/cn";
import { formatDay, formatMoney, invoiceStatusLabel } from "./format-billing";

const col = createColumnHelper<BillingInvoice>();

export function InvoicesTable({ invoices }: { invoices: BillingInvoice[] }) {
  const columns = useMemo(
    () => [
      col.accessor("number", { header: "Invoice", cell: (c) => <span className="font-mono text-xs">{c.getValue() ?? c.row.original.id}</span> }),
      col.accessor("createdAt", { header: "Issued", cell: (c) => formatDay(c.getValue()) }),
      col.display({ id: "period", header: "Period", cell: (c) => `${formatDay(c.row.original.periodStart)} – ${formatDay(c.row.original.periodEnd)}` }),
      col.accessor("amountDue", { header: "Amount", cell: (c) => formatMoney(c.getValue(), c.row.original.currency) }),
      col.accessor("status", {
        header: "Status",
        cell: (c) => (
          <span className={cn("rounded-full px-2 py-0.5 text-xs font-medium", c.getValue() === "paid" ? "bg-moss-500/15 text-moss-500" : "bg-thread-100 text-thread-700")}>
            {invoiceStatusLabel(c.getValue())}
          </span>
        ),
      }),
    ],
    [],
  );
  const table = useDataTable({ data: invoices, columns, getRowId: (r) => r.id });
  return <DataTable table={table} flexRender={flexRender} caption="Invoices" />;
}
