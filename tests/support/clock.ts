import type { Clock } from "~/orders/clock.server";

/** A clock that stands still until a test moves it. */
export interface TestClock extends Clock {
  set(at: Date | string): void;
  advance(ms: number): void;
  advanceMinutes(minutes: number): void;
  advanceDays(days: number): void;
}

export function testClock(start: Date | string = "2026-12-30T10:00:00Z"): TestClock {
  let at = new Date(start).getTime();
  return {
    now: () => new Date(at),
    set: (to) => void (at = new Date(to).getTime()),
    advance: (ms) => void (at += ms),
    advanceMinutes: (minutes) => void (at += minutes * 60_000),
    advanceDays: (days) => void (at += days * 86_400_000),
  };
}
