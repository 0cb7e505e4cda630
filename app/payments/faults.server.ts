// Named points between a provider call and the database write that follows it. Tests arm one to
// throw, as a crash there would, and check that a retry leaves the order and ledger consistent.
// Disarmed (the default) they cost a map lookup.

export type FaultPoint = "release:after-transfer" | "refund:after-refund" | "event:after-provider";

const armed = new Map<FaultPoint, number>();

export class InjectedFault extends Error {
  override name = "InjectedFault";
}

/** Arms `point` to throw the next `times` times it is reached. */
export function armFault(point: FaultPoint, times = 1): void {
  armed.set(point, times);
}

export function disarmFaults(): void {
  armed.clear();
}

export function faultPoint(point: FaultPoint): void {
  const left = armed.get(point);
  if (!left) return;
  if (left <= 1) armed.delete(point);
  else armed.set(point, left - 1);
  throw new InjectedFault(`Injected fault at ${point}`);
}
