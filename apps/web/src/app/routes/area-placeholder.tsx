import { EmptyState, PageHeader } from "@/components/ui/card";

/** An area whose screens are not built yet; says so plainly instead of pretending. */
export function AreaPlaceholder({ title, what }: { title: string; what: string }) {
  return (
    <div className="max-w-4xl">
      <PageHeader title={title} />
      <EmptyState title="Not available yet">{what}</EmptyState>
    </div>
  );
}
