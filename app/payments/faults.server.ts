// Named points between a provider call and the database write that follows it. Tests arm one to
// throw, as a failure there would, or to kill the process outright, as a crash would, and check that
// a retry leaves the order and ledger consistent. Disarmed (always, outside tests) they cost a map lookup.

export type FaultPoint = "release:after-transfer" | "refund:after-refund" | "event:after-provider";

const armed = new Map<FaultPoint, { times: number; kill: boolean }>();

export class InjectedFault extends Error {
  override name = "InjectedFault";
}

/** Arms `point` to throw (or with `kill`, to end the process with SIGKILL) the next `times` times it is reached. */
export function armFault(point: FaultPoint, { times = 1, kill = false }: { times?: number; kill?: boolean } = {}): void {
  armed.set(point, { times, kill });
}

export function disarmFaults(): void {
  armed.clear();
}

export function faultPoint(point: FaultPoint): void {
  const fault = armed.get(point);
  if (!fault) return;
  if (fault.times <= 1) armed.delete(point);
  else fault.times--;
  if (fault.kill) process.kill(process.pid, "SIGKILL");
  throw new InjectedFault(`Injected fault at ${point}`);
}
