/**
 * The one place dates become text: the browser's locale (Intl with no locale argument), a
 * medium date style, and relative words where they help ("due in 3 days", "5 minutes ago").
 */
const dayFormat = new Intl.DateTimeFormat(undefined, { dateStyle: "medium" });
const dayTimeFormat = new Intl.DateTimeFormat(undefined, { dateStyle: "medium", timeStyle: "short" });
const timeFormat = new Intl.DateTimeFormat(undefined, { timeStyle: "short" });

const DAY_MS = 86_400_000;

/** A calendar day "2027-03-31" as a local Date at midnight (never shifted by the time zone). */
function localDay(day: string): Date {
  const [y, m, d] = day.split("-").map(Number);
  return new Date(y!, (m ?? 1) - 1, d ?? 1);
}

/** A timestamp (ISO string) or calendar day (YYYY-MM-DD) as a date: "2 Dec 2026". */
export function formatDate(value: string): string {
  return dayFormat.format(/^\d{4}-\d{2}-\d{2}$/.test(value) ? localDay(value) : new Date(value));
}

/** A timestamp with its time of day: "2 Dec 2026, 18:03". */
export function formatDateTime(value: string): string {
  return dayTimeFormat.format(new Date(value));
}

/** The time of day only: "18:03". */
export function formatTime(value: string | Date): string {
  return timeFormat.format(typeof value === "string" ? new Date(value) : value);
}

/** Whole days from today to a calendar day (negative when past), in the browser's time zone. */
export function daysUntil(day: string, now = new Date()): number {
  const today = new Date(now.getFullYear(), now.getMonth(), now.getDate());
  return Math.round((localDay(day).getTime() - today.getTime()) / DAY_MS);
}

/** A due day in words relative to today: "due today", "due tomorrow", "due in 3 days", "due in 5 weeks", "due in 8 months", "2 days overdue". */
export function formatDue(day: string, now = new Date()): { text: string; late: boolean; soon: boolean } {
  const n = daysUntil(day, now);
  if (n < 0) return { text: `${-n} day${n === -1 ? "" : "s"} overdue`, late: true, soon: false };
  if (n === 0) return { text: "due today", late: false, soon: true };
  if (n === 1) return { text: "due tomorrow", late: false, soon: true };
  // Past six weeks a count of days stops helping; whole weeks or months read better.
  if (n > 60) return { text: `due in ${Math.round(n / 30.44)} months`, late: false, soon: false };
  if (n > 14) return { text: `due in ${Math.round(n / 7)} weeks`, late: false, soon: false };
  return { text: `due in ${n} days`, late: false, soon: n <= 3 };
}

/** How long ago a timestamp was: "just now", "5 minutes ago", "3 hours ago", else the date. */
export function formatAgo(value: string, now = new Date()): string {
  const s = Math.round((now.getTime() - new Date(value).getTime()) / 1000);
  if (s < 45) return "just now";
  if (s < 3600) return `${Math.max(1, Math.round(s / 60))} minute${Math.round(s / 60) <= 1 ? "" : "s"} ago`;
  if (s < 86_400) return `${Math.round(s / 3600)} hour${Math.round(s / 3600) === 1 ? "" : "s"} ago`;
  return formatDate(value);
}
