import { cn } from "@/lib/cn";
import { formatDate, formatDue } from "@/lib/dates";

/** A due day: the date in the browser's locale and how far off it is ("due in 3 days", "2 days overdue"). */
export function DueDate({ day, className }: { day: string | null; className?: string }) {
  if (!day) return <span className="text-ink-500">No due date</span>;
  const due = formatDue(day);
  return (
    <span className={cn("whitespace-nowrap", className)}>
      {formatDate(day)} <span className={cn("text-xs", due.late ? "font-medium text-rust-500" : due.soon ? "text-thread-700" : "text-ink-500")}>· {due.text}</span>
    </span>
  );
}
