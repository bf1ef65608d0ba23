import { describe, expect, it } from "vitest";
import { daysUntil, formatAgo, formatDue } from "./dates";

// Calendar arithmetic checked by hand (common practice): 2030-03-01 is 28 days after 2030-02-01.
describe("relative dates", () => {
  const now = new Date(2030, 1, 1, 15, 30);
  it("counts calendar days in the browser's time zone, whatever the time of day", () => {
    expect(daysUntil("2030-02-01", now)).toBe(0);
    expect(daysUntil("2030-03-01", now)).toBe(28);
    expect(daysUntil("2030-01-30", now)).toBe(-2);
  });
  it("says due dates in words that help", () => {
    expect(formatDue("2030-02-01", now).text).toBe("due today");
    expect(formatDue("2030-02-02", now).text).toBe("due tomorrow");
    expect(formatDue("2030-02-04", now)).toEqual({ text: "due in 3 days", late: false, soon: true });
    expect(formatDue("2030-03-01", now).text).toBe("due in 4 weeks");
    expect(formatDue("2031-02-01", now).text).toBe("due in 12 months");
    expect(formatDue("2030-01-31", now)).toEqual({ text: "1 day overdue", late: true, soon: false });
  });
  it("says how long ago", () => {
    expect(formatAgo(new Date(now.getTime() - 20_000).toISOString(), now)).toBe("just now");
    expect(formatAgo(new Date(now.getTime() - 5 * 60_000).toISOString(), now)).toBe("5 minutes ago");
    expect(formatAgo(new Date(now.getTime() - 3 * 3600_000).toISOString(), now)).toBe("3 hours ago");
  });
});
