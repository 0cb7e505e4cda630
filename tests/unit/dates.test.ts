import { describe, expect, it } from "vitest";
import { dayText, momentText, monthText, timeOfDayText } from "@shared/dates";

// The site's one way of writing dates. Expected strings are written out by hand: day, short month,
// year; moments in 24-hour UTC with the zone named.

describe("dates", () => {
  it("writes a day as 2 Dec 2026, from a timestamp, a calendar date or a Date", () => {
    expect(dayText("2026-12-02T23:59:00Z")).toBe("2 Dec 2026");
    expect(dayText("2026-12-02")).toBe("2 Dec 2026");
    expect(dayText(new Date(Date.UTC(2027, 0, 1, 0, 30)))).toBe("1 Jan 2027");
  });

  it("writes the day in UTC, never the server's or the browser's zone", () => {
    // 23:30 UTC on 31 Dec is already 1 Jan east of Greenwich.
    expect(dayText("2026-12-31T23:30:00Z")).toBe("31 Dec 2026");
    expect(dayText("2026-12-31T23:30:00-05:00")).toBe("1 Jan 2027");
  });

  it("writes a moment with a 24-hour UTC time", () => {
    expect(momentText("2026-12-02T14:05:00Z")).toBe("2 Dec 2026, 14:05 UTC");
    expect(momentText("2026-12-02T00:07:00Z")).toBe("2 Dec 2026, 00:07 UTC");
    expect(timeOfDayText("2026-12-02T09:41:59Z")).toBe("09:41 UTC");
  });

  it("writes a month in full", () => {
    expect(monthText("2026-12-02T14:05:00Z")).toBe("December 2026");
  });
});
