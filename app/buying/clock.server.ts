import { systemClock, type Clock } from "~/orders/clock.server";

// The clock the buying pages pass to the order transitions: the system's, except where the test
// stack moves time (ORDERS' clock decides; pages never read Date.now() for a deadline themselves).

export async function requestClock(): Promise<Clock> {
  return systemClock;
}
